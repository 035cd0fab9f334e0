import { propSlip, type SeaTrialLoadingResult } from "~/lib/calc";
import { colours, DiagramFrame, fixed, Label, r, ticks, VerdictLine } from "./svg-kit";

export interface SeaTrialPoint {
  /** Engine rpm. */
  rpm: number;
  knots: number;
  label?: string;
}

export interface SeaTrialDiagramProps {
  points?: SeaTrialPoint[];
  ratedRpmMin?: number;
  ratedRpmMax?: number;
  wotRpm?: number;
  /** seaTrialLoading's result, said under the chart. */
  loading?: SeaTrialLoadingResult;
  /** The propeller's pitch speed (no slip) against engine rpm, drawn as a line; with it each point shows its slip. */
  pitchLine?: { pitchIn: number; gearRatio: number };
}

const W = 640;
const LEFT = 84;
const RIGHT = 610;
const TOP = 50;
const BOTTOM = 250;

/** The loading verdict in words, and the indicative pitch change when out of the band. */
function loadingWords(loading: SeaTrialLoadingResult, wot: string): { verdict: string; change?: string } {
  const change = `${fixed(Math.abs(loading.pitchChangeIn), 2)} in`;
  switch (loading.verdict) {
    case "over-propped":
      return {
        verdict: `Over-propped: ${wot} is below the rated band`,
        change: `Indicative: about ${change} less pitch; the propeller shop advises`,
      };
    case "under-propped":
      return {
        verdict: `Under-propped: ${wot} is above the rated band`,
        change: `Indicative: about ${change} more pitch; the propeller shop advises`,
      };
    default:
      return { verdict: `In range: ${wot} is within the rated band` };
  }
}

/** Engine rpm against speed, with the rated rpm band shaded and named, the WOT rpm drawn across, and the loading verdict. */
export function SeaTrialDiagram({
  points = [],
  ratedRpmMin,
  ratedRpmMax,
  wotRpm,
  loading,
  pitchLine,
}: SeaTrialDiagramProps) {
  const rpm = (v: number) => `${fixed(v, 0)} rpm`;
  const knotsAt = (engineRpm: number) =>
    pitchLine
      ? propSlip({ pitchIn: pitchLine.pitchIn, engineRpm, gearRatio: pitchLine.gearRatio, speedKnots: 0 })
          .theoreticalKnots
      : 0;
  const slipAt = (p: SeaTrialPoint) =>
    pitchLine
      ? propSlip({
          pitchIn: pitchLine.pitchIn,
          engineRpm: p.rpm,
          gearRatio: pitchLine.gearRatio,
          speedKnots: p.knots,
        }).slipPercent
      : undefined;

  const rpms = [...points.map((p) => p.rpm), ratedRpmMax ?? 0, wotRpm ?? 0];
  const yTicks = ticks(Math.max(...rpms, 1000) * 1.1);
  const yTop = yTicks[yTicks.length - 1];
  const highestKnots = Math.max(0, ...points.map((p) => p.knots), pitchLine ? knotsAt(Math.max(...rpms)) : 0);
  const xTicks = highestKnots > 0 ? ticks(highestKnots * 1.1, 5) : [];
  const xTop = xTicks[xTicks.length - 1] ?? 1;
  const y = (v: number) => BOTTOM - (v / yTop) * (BOTTOM - TOP);
  const x = (v: number) => LEFT + (v / xTop) * (RIGHT - LEFT);

  const hasBand = ratedRpmMin !== undefined && ratedRpmMax !== undefined;
  const wotText = wotRpm !== undefined ? `WOT ${rpm(wotRpm)}` : "";
  const sorted = [...points].sort((a, b) => a.knots - b.knots);
  const pointText = (p: SeaTrialPoint) => {
    const slip = slipAt(p);
    return `${p.label ? `${p.label}: ` : ""}${rpm(p.rpm)}, ${fixed(p.knots, 1)} kn${slip !== undefined ? `, slip ${fixed(slip, 1)}%` : ""}`;
  };
  const verdict = loading && wotRpm !== undefined ? loadingWords(loading, wotText) : undefined;
  const H = 310 + (verdict ? 26 : 0) + (verdict?.change ? 20 : 0);

  const title = [
    "Sea trial: engine rpm against speed",
    hasBand ? `rated band ${rpm(ratedRpmMin)} to ${rpm(ratedRpmMax)}` : "",
    wotText,
    ...points.map(pointText),
    pitchLine
      ? `pitch speed line for ${fixed(pitchLine.pitchIn, 2)} in pitch at ${fixed(pitchLine.gearRatio, 3)} : 1`
      : "",
    verdict?.verdict ?? "",
    verdict?.change ?? "",
  ]
    .filter(Boolean)
    .join(". ");

  const pitchEnd = pitchLine ? Math.min(yTop, (xTop / knotsAt(yTop)) * yTop) : 0;

  return (
    <DiagramFrame width={W} height={H} title={`${title}.`}>
      <Label x={16} y={26} text="Sea trial: engine rpm against speed" size={16} bold />
      <Label x={LEFT} y={TOP - 8} text="engine rpm" size={12} anchor="end" fill={colours.inkSoft} />
      {hasBand && (
        <g>
          <rect
            x={LEFT}
            y={r(y(ratedRpmMax))}
            width={RIGHT - LEFT}
            height={r(Math.max(2, y(ratedRpmMin) - y(ratedRpmMax)))}
            fill={colours.brassLight}
            stroke={colours.brass}
            strokeWidth={1.5}
            strokeDasharray="4 3"
          />
          <Label
            x={LEFT + 8}
            y={r(y(ratedRpmMin) - y(ratedRpmMax) >= 20 ? y(ratedRpmMax) + 16 : y(ratedRpmMax) - 6)}
            text={`rated band ${rpm(ratedRpmMin)} to ${rpm(ratedRpmMax)}`}
            size={13}
            bold
            fill={colours.brass}
          />
        </g>
      )}
      {yTicks.map((t) => (
        <g key={`y${t}`}>
          <line x1={LEFT} y1={r(y(t))} x2={RIGHT} y2={r(y(t))} stroke={colours.rule} strokeWidth={1} />
          <Label
            x={LEFT - 6}
            y={r(y(t)) + 4}
            text={fixed(t, 0)}
            size={12}
            anchor="end"
            fill={colours.inkSoft}
          />
        </g>
      ))}
      {xTicks.map((t) => (
        <g key={`x${t}`}>
          <line
            x1={r(x(t))}
            y1={BOTTOM}
            x2={r(x(t))}
            y2={BOTTOM + 5}
            stroke={colours.ink}
            strokeWidth={1.5}
          />
          <Label
            x={r(x(t))}
            y={BOTTOM + 19}
            text={fixed(t, 1)}
            size={12}
            anchor="middle"
            fill={colours.inkSoft}
          />
        </g>
      ))}
      <line x1={LEFT} y1={TOP} x2={LEFT} y2={BOTTOM} stroke={colours.ink} strokeWidth={1.5} />
      <line x1={LEFT} y1={BOTTOM} x2={RIGHT} y2={BOTTOM} stroke={colours.ink} strokeWidth={1.5} />
      <Label
        x={(LEFT + RIGHT) / 2}
        y={BOTTOM + 38}
        text={xTicks.length ? "speed through the water (kn)" : "speed: no runs entered"}
        size={12}
        anchor="middle"
        fill={colours.inkSoft}
      />

      {pitchLine && pitchEnd > 0 && (
        <g>
          <line
            x1={LEFT}
            y1={BOTTOM}
            x2={r(x(knotsAt(pitchEnd)))}
            y2={r(y(pitchEnd))}
            stroke={colours.inkSoft}
            strokeWidth={2}
            strokeDasharray="3 4"
          />
          <Label
            x={r(x(knotsAt(pitchEnd)) - 6)}
            y={r(y(pitchEnd) + 16)}
            halo
            text="pitch speed, no slip"
            size={12}
            anchor="end"
            fill={colours.inkSoft}
          />
        </g>
      )}
      {wotRpm !== undefined && (
        <g>
          <line
            x1={LEFT}
            y1={r(y(wotRpm))}
            x2={RIGHT}
            y2={r(y(wotRpm))}
            stroke={colours.harbour}
            strokeWidth={2.5}
            strokeDasharray="9 5"
          />
          <Label
            x={RIGHT - 4}
            y={r(y(wotRpm)) - 6}
            halo
            text={wotText}
            size={13}
            anchor="end"
            bold
            fill={colours.harbour}
          />
        </g>
      )}
      {sorted.length > 1 && (
        <polyline
          points={sorted.map((p) => `${r(x(p.knots))},${r(y(p.rpm))}`).join(" ")}
          fill="none"
          stroke={colours.ink}
          strokeWidth={2}
        />
      )}
      {sorted.map((p, i) => (
        <g key={i}>
          <circle
            cx={r(x(p.knots))}
            cy={r(y(p.rpm))}
            r={6}
            fill={colours.ink}
            stroke={colours.card}
            strokeWidth={1.5}
          />
          <Label
            x={r(x(p.knots) + (x(p.knots) > RIGHT - 170 ? -10 : 10))}
            y={r(y(p.rpm) + 18)}
            halo
            text={pointText(p)}
            size={12}
            anchor={x(p.knots) > RIGHT - 170 ? "end" : "start"}
            bold
          />
        </g>
      ))}

      {verdict && loading && (
        <VerdictLine x={16} y={326} pass={loading.verdict === "in-range"} text={verdict.verdict} size={14} />
      )}
      {verdict?.change && <Label x={42} y={346} text={verdict.change} size={13} />}
    </DiagramFrame>
  );
}
