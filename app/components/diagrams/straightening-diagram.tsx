import type { StraighteningResult } from "~/lib/calc";
import {
  LimitLine,
  colours,
  DiagramFrame,
  formatLength,
  Label,
  r,
  ticks,
  VerdictLine,
  VerdictMark,
  type LengthUnit,
} from "./svg-kit";

export interface StraighteningDiagramProps {
  /** straighteningHistory's result: the worst-station TIR after each attempt. */
  history: StraighteningResult;
  limitTirIn: number;
  /** Names of the attempts ("As found", "After press 1"…); "Attempt 1"… when absent. */
  attemptLabels?: string[];
  lengthUnit?: LengthUnit;
}

const W = 640;
const H = 320;
const LEFT = 84;
const RIGHT = 616;
const TOP = 50;
const BOTTOM = 236;

/** The worst TIR after each straightening attempt as a line of points, coming down (or not) to the limit. */
export function StraighteningDiagram({
  history,
  limitTirIn,
  attemptLabels,
  lengthUnit = "in",
}: StraighteningDiagramProps) {
  const { attempts, bestTirIn, bestAttempt, reachedLimitAt } = history;
  const len = (v: number) => formatLength(v, lengthUnit);
  const nameOf = (i: number) => attemptLabels?.[i] || `Attempt ${i + 1}`;

  const yTicks = ticks(Math.max(...attempts.map((a) => a.tirIn), limitTirIn, 0.001) * 1.3);
  const yTop = yTicks[yTicks.length - 1];
  const y = (v: number) => BOTTOM - (v / yTop) * (BOTTOM - TOP);
  const x = (i: number) =>
    attempts.length === 1
      ? (LEFT + RIGHT) / 2
      : LEFT + 40 + (i / (attempts.length - 1)) * (RIGHT - LEFT - 80);
  const limitY = y(limitTirIn);
  // The limit's label goes at the right unless the last attempt's number sits on it there.
  const clearance = (i: number) => Math.abs(y(attempts[i].tirIn) - limitY);
  const limitLabelLeft = clearance(attempts.length - 1) < 30 && clearance(0) > clearance(attempts.length - 1);

  const reached = reachedLimitAt !== undefined;
  const summary = reached
    ? `Within the ${len(limitTirIn)} limit: ${len(attempts[reachedLimitAt].tirIn)} (${nameOf(reachedLimitAt)})`
    : `Not yet within the ${len(limitTirIn)} limit: best ${len(bestTirIn)} (${nameOf(bestAttempt)})`;
  const title = `Straightening attempts: worst-station TIR after each. ${attempts
    .map((a, i) => `${nameOf(i)}: ${len(a.tirIn)}`)
    .join(", ")}. ${summary}.`;

  return (
    <DiagramFrame width={W} height={H} title={title}>
      <Label x={16} y={26} text="Straightening: worst TIR after each attempt" size={16} bold />
      <Label
        x={LEFT}
        y={TOP - 8}
        text={`TIR (${lengthUnit})`}
        size={12}
        anchor="end"
        fill={colours.inkSoft}
      />
      {limitTirIn < yTop && (
        <rect x={LEFT} y={TOP} width={RIGHT - LEFT} height={r(limitY - TOP)} fill={colours.faultLight} />
      )}
      {yTicks.map((t) => (
        <g key={t}>
          <line x1={LEFT} y1={r(y(t))} x2={RIGHT} y2={r(y(t))} stroke={colours.rule} strokeWidth={1} />
          <Label x={LEFT - 6} y={r(y(t)) + 4} text={len(t)} size={12} anchor="end" fill={colours.inkSoft} />
        </g>
      ))}
      <line x1={LEFT} y1={TOP} x2={LEFT} y2={BOTTOM} stroke={colours.ink} strokeWidth={1.5} />
      <line x1={LEFT} y1={BOTTOM} x2={RIGHT} y2={BOTTOM} stroke={colours.ink} strokeWidth={1.5} />
      <LimitLine
        left={LEFT}
        right={RIGHT}
        y={limitY}
        text={`limit ${len(limitTirIn)}`}
        labelLeft={limitLabelLeft}
      />

      <polyline
        points={attempts.map((a, i) => `${r(x(i))},${r(y(a.tirIn))}`).join(" ")}
        fill="none"
        stroke={colours.ink}
        strokeWidth={2.5}
      />
      {attempts.map((a, i) => (
        <g key={i}>
          <VerdictMark x={x(i)} y={y(a.tirIn)} pass={a.withinLimit} size={16} />
          <Label x={r(x(i))} y={r(y(a.tirIn) - 14)} halo text={len(a.tirIn)} size={13} anchor="middle" bold />
          <Label x={r(x(i))} y={BOTTOM + 18} text={nameOf(i)} size={13} anchor="middle" bold />
          {i > 0 && (
            <Label
              x={r(x(i))}
              y={BOTTOM + 34}
              text={
                a.changeIn < 0
                  ? `down ${len(-a.changeIn)}`
                  : a.changeIn > 0
                    ? `up ${len(a.changeIn)}`
                    : "no change"
              }
              size={12}
              anchor="middle"
              fill={colours.inkSoft}
            />
          )}
        </g>
      ))}

      <VerdictLine x={16} y={H - 16} pass={reached} text={summary} />
    </DiagramFrame>
  );
}
