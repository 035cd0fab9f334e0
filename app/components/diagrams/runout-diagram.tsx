import type { RunoutResult } from "~/lib/calc";
import { atMost } from "~/lib/calc/numbers";
import {
  LimitLine,
  colours,
  DiagramFrame,
  fixed,
  formatLength,
  Label,
  r,
  ticks,
  VerdictLine,
  VerdictMark,
  wrap,
  type LengthUnit,
} from "./svg-kit";

export interface RunoutDiagramProps {
  result: RunoutResult;
  limitTirIn: number;
  /** Names of the stations (the readings grid's rows); "Station 1"… when absent. */
  stationLabels?: string[];
  /** Names of the dial angles (the grid's columns), to say where each high spot is. */
  angleLabels?: string[];
  /** False when the positions are only station numbers, not measured distances. */
  showPositions?: boolean;
  lengthUnit?: LengthUnit;
}

const W = 640;
const H = 360;
const LEFT = 84;
const RIGHT = 616;
const TOP = 50;
const BOTTOM = 220;

/** TIR at each station along the shaft as bars, with the limit drawn across and the worst station named. */
export function RunoutDiagram({
  result,
  limitTirIn,
  stationLabels,
  angleLabels,
  showPositions = true,
  lengthUnit = "in",
}: RunoutDiagramProps) {
  const { stations, worstStation, maxTirIn, pass } = result;
  const len = (v: number) => formatLength(v, lengthUnit);
  const nameOf = (i: number) => stationLabels?.[i] || `Station ${i + 1}`;
  const angleOf = (i: number) =>
    angleLabels?.[stations[i].highSpotIndex] ?? `${fixed(stations[i].highSpotAngleDeg, 0)}°`;

  const yTicks = ticks(Math.max(maxTirIn, limitTirIn, 0.001) * 1.45);
  const yTop = yTicks[yTicks.length - 1];
  const y = (v: number) => BOTTOM - (v / yTop) * (BOTTOM - TOP);

  const positions = stations.map((s) => s.positionIn);
  const span = Math.max(...positions) - Math.min(...positions);
  const pad = 44;
  const x = (i: number) => {
    if (stations.length === 1) return (LEFT + RIGHT) / 2;
    if (showPositions && span > 0)
      return LEFT + pad + ((positions[i] - Math.min(...positions)) / span) * (RIGHT - LEFT - 2 * pad);
    return LEFT + pad + (i / (stations.length - 1)) * (RIGHT - LEFT - 2 * pad);
  };

  // Characters per line under each bar: the narrowest gap between neighbouring stations, at about 6.5 px a character.
  const gaps = stations.slice(1).map((_, i) => x(i + 1) - x(i));
  const labelChars = Math.max(8, Math.floor(Math.min(RIGHT - LEFT, ...gaps) / 6.5));
  const nameLines = Math.max(...stations.map((_, i) => wrap(nameOf(i), labelChars).length));
  const worstName = nameOf(worstStation);
  const verdictWords = (name: string) =>
    `${pass ? "Within the limit" : "Over the limit"}: worst TIR ${len(maxTirIn)} at ${name}, limit ${len(limitTirIn)}`;
  const summary = verdictWords(worstName);
  const title = `Shaft runout along the shaft. ${summary}. ${stations
    .map(
      (s, i) =>
        `${nameOf(i)}: ${len(s.tirIn)}${showPositions ? ` at ${len(s.positionIn)}` : ""}, high spot ${angleOf(i)}`,
    )
    .join("; ")}.`;
  const limitY = y(limitTirIn);
  // The limit's label goes at the right unless the last station's numbers sit on it there.
  const clearance = (i: number) => Math.abs(y(stations[i].tirIn) - limitY);
  const limitLabelLeft = clearance(stations.length - 1) < 45 && clearance(0) > clearance(stations.length - 1);
  const shaftLeft = x(0) - 34;
  const shaftRight = x(stations.length - 1) + 34;

  return (
    <DiagramFrame width={W} height={H} title={title}>
      <Label x={16} y={26} text="Runout along the shaft: TIR at each station" size={16} bold />
      <Label
        x={LEFT}
        y={TOP - 8}
        text={`TIR (${lengthUnit})`}
        size={12}
        anchor="end"
        fill={colours.inkSoft}
      />

      {limitTirIn < yTop && (
        <g>
          <rect x={LEFT} y={TOP} width={RIGHT - LEFT} height={r(limitY - TOP)} fill={colours.faultLight} />
          <Label x={LEFT + 8} y={TOP + 16} text="over the limit" size={12} fill={colours.fault} />
        </g>
      )}
      {yTicks.map((t) => (
        <g key={t}>
          <line x1={LEFT} y1={r(y(t))} x2={RIGHT} y2={r(y(t))} stroke={colours.rule} strokeWidth={1} />
          <Label x={LEFT - 6} y={r(y(t)) + 4} text={len(t)} size={12} anchor="end" fill={colours.inkSoft} />
        </g>
      ))}
      <line x1={LEFT} y1={TOP} x2={LEFT} y2={BOTTOM} stroke={colours.ink} strokeWidth={1.5} />
      <line x1={LEFT} y1={BOTTOM} x2={RIGHT} y2={BOTTOM} stroke={colours.ink} strokeWidth={1.5} />

      {stations.map((s, i) => {
        const within = atMost(s.tirIn, limitTirIn);
        const top = y(s.tirIn);
        return (
          <g key={i}>
            <rect
              x={r(x(i) - 11)}
              y={r(top)}
              width={22}
              height={r(BOTTOM - top)}
              fill={within ? colours.soundLight : colours.faultLight}
              stroke={within ? colours.sound : colours.fault}
              strokeWidth={2}
            />
            <VerdictMark x={x(i)} y={top - 11} pass={within} size={14} />
            <Label x={r(x(i))} y={r(top - 24)} halo text={len(s.tirIn)} size={13} anchor="middle" bold />
            {i === worstStation && (
              <Label
                x={r(x(i))}
                y={r(top - 40)}
                text="worst"
                size={12}
                anchor="middle"
                bold
                fill={within ? colours.ink : colours.fault}
              />
            )}
            {wrap(nameOf(i), labelChars).map((line, l) => (
              <Label
                key={l}
                x={r(x(i))}
                y={BOTTOM + 17 + l * 14}
                text={line}
                size={12}
                anchor="middle"
                bold
              />
            ))}
            {showPositions && (
              <Label
                x={r(x(i))}
                y={BOTTOM + 19 + nameLines * 14}
                text={`at ${len(s.positionIn)}`}
                size={12}
                anchor="middle"
                fill={colours.inkSoft}
              />
            )}
            <Label
              x={r(x(i))}
              y={BOTTOM + 19 + (nameLines + (showPositions ? 1 : 0)) * 14}
              text={`high spot ${angleOf(i)}`}
              size={12}
              anchor="middle"
              fill={colours.inkSoft}
            />
            <path
              d={`M ${r(x(i) - 6)} ${BOTTOM + 68} L ${r(x(i) + 6)} ${BOTTOM + 68} L ${r(x(i))} ${BOTTOM + 76} Z`}
              fill={colours.ink}
            />
          </g>
        );
      })}

      <LimitLine
        left={LEFT}
        right={RIGHT}
        y={limitY}
        text={`limit ${len(limitTirIn)}`}
        labelLeft={limitLabelLeft}
      />

      <rect
        x={r(shaftLeft)}
        y={BOTTOM + 78}
        width={r(shaftRight - shaftLeft)}
        height={14}
        rx={3}
        fill={colours.paper}
        stroke={colours.inkSoft}
        strokeWidth={1.5}
      />
      <Label
        x={r(shaftLeft) - 6}
        y={BOTTOM + 90}
        text="shaft"
        size={12}
        anchor="end"
        fill={colours.inkSoft}
      />

      <VerdictLine x={16} y={H - 16} pass={pass} text={verdictWords(wrap(worstName, 28, 1)[0])} size={14} />
    </DiagramFrame>
  );
}
