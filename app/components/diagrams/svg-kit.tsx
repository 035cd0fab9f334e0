import type { ReactNode } from "react";

/**
 * The parts every diagram is drawn with. Diagrams are plain SVG with inline attributes (no CSS,
 * no hooks, no foreignObject) because the same markup goes through renderToStaticMarkup into the
 * PDF record. Colours repeat the theme in app/app.css; a verdict is always a word and a shape too.
 */
export const colours = {
  ink: "#15212c",
  inkSoft: "#3b4a57",
  paper: "#f6f3ec",
  card: "#ffffff",
  rule: "#c9c2b3",
  copper: "#9c4221",
  brass: "#8a6100",
  brassLight: "#fbefc8",
  sound: "#17624f",
  soundLight: "#dcefe8",
  fault: "#a4161a",
  faultLight: "#fbe3e1",
  harbour: "#1e4e79",
} as const;

export const FONT = "Atkinson Hyperlegible, sans-serif";

/** How a diagram writes lengths: the library works in inches, the shop may read thou or mm. */
export type LengthUnit = "in" | "thou" | "mm";

/** Fixed decimals, trailing zeros dropped down to `minDecimals`; never "-0". */
export function fixed(value: number, maxDecimals: number, minDecimals = 0): string {
  let text = value.toFixed(maxDecimals);
  if (text.includes(".")) {
    const [whole, fraction] = text.split(".");
    let digits = fraction;
    while (digits.length > minDecimals && digits.endsWith("0")) digits = digits.slice(0, -1);
    text = digits ? `${whole}.${digits}` : whole;
  }
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** A length given in inches, written in the shop's unit: "0.004 in", "4 thou", "0.102 mm". */
export function formatLength(valueIn: number, unit: LengthUnit = "in"): string {
  const size = Math.abs(valueIn);
  switch (unit) {
    case "thou":
      return `${fixed(valueIn * 1000, size * 1000 >= 100 ? 0 : 2)} thou`;
    case "mm": {
      const mm = valueIn * 25.4;
      return `${fixed(mm, Math.abs(mm) >= 100 ? 1 : 3)} mm`;
    }
    default:
      return `${size >= 10 ? fixed(valueIn, 2) : size >= 1 ? fixed(valueIn, 3) : fixed(valueIn, 4, 3)} in`;
  }
}

/** The outer SVG: a fixed coordinate box, a title for screen readers and a paper background. */
export function DiagramFrame({
  width,
  height,
  title,
  children,
}: {
  width: number;
  height: number;
  title: string;
  children: ReactNode;
}) {
  return (
    <svg
      xmlns="http://www.w3.org/2000/svg"
      viewBox={`0 0 ${width} ${height}`}
      width={width}
      height={height}
      role="img"
      fontFamily={FONT}
    >
      <title>{title}</title>
      <rect
        x={0}
        y={0}
        width={width}
        height={height}
        fill={colours.card}
        stroke={colours.rule}
        strokeWidth={1}
      />
      {children}
    </svg>
  );
}

export function Label({
  x,
  y,
  text,
  size = 14,
  anchor = "start",
  bold = false,
  fill = colours.ink,
  halo = false,
}: {
  x: number;
  y: number;
  text: string;
  size?: number;
  anchor?: "start" | "middle" | "end";
  bold?: boolean;
  fill?: string;
  /** A white outline under the words, so they stay legible where they cross a line. */
  halo?: boolean;
}) {
  const common = {
    x,
    y,
    fontSize: size,
    textAnchor: anchor,
    fontWeight: bold ? "bold" : "normal",
    fontFamily: FONT,
  } as const;
  if (!halo) {
    return (
      <text {...common} fill={fill}>
        {text}
      </text>
    );
  }
  return (
    <g>
      <text {...common} fill={colours.card} stroke={colours.card} strokeWidth={4} strokeLinejoin="round">
        {text}
      </text>
      <text {...common} fill={fill}>
        {text}
      </text>
    </g>
  );
}

/** A straight arrow from (x1, y1) to (x2, y2) with a filled head drawn as a path. */
export function Arrow({
  x1,
  y1,
  x2,
  y2,
  colour = colours.ink,
  width = 3,
  head = 10,
}: {
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  colour?: string;
  width?: number;
  head?: number;
}) {
  const length = Math.hypot(x2 - x1, y2 - y1) || 1;
  const ux = (x2 - x1) / length;
  const uy = (y2 - y1) / length;
  const baseX = x2 - ux * head;
  const baseY = y2 - uy * head;
  const half = head * 0.6;
  const d = `M ${r(x2)} ${r(y2)} L ${r(baseX - uy * half)} ${r(baseY + ux * half)} L ${r(baseX + uy * half)} ${r(baseY - ux * half)} Z`;
  return (
    <g>
      <line x1={r(x1)} y1={r(y1)} x2={r(baseX)} y2={r(baseY)} stroke={colour} strokeWidth={width} />
      <path d={d} fill={colour} stroke={colour} strokeWidth={1} />
    </g>
  );
}

/** Within: a circle with a tick. Over: a triangle with an exclamation mark. Never colour alone. */
export function VerdictMark({
  x,
  y,
  pass,
  size = 16,
}: {
  x: number;
  y: number;
  pass: boolean;
  size?: number;
}) {
  const s = size / 2;
  if (pass) {
    return (
      <g>
        <circle cx={r(x)} cy={r(y)} r={s} fill={colours.soundLight} stroke={colours.sound} strokeWidth={2} />
        <path
          d={`M ${r(x - s * 0.5)} ${r(y)} L ${r(x - s * 0.1)} ${r(y + s * 0.45)} L ${r(x + s * 0.55)} ${r(y - s * 0.45)}`}
          fill="none"
          stroke={colours.sound}
          strokeWidth={2.5}
        />
      </g>
    );
  }
  return (
    <g>
      <path
        d={`M ${r(x)} ${r(y - s)} L ${r(x + s * 1.1)} ${r(y + s * 0.9)} L ${r(x - s * 1.1)} ${r(y + s * 0.9)} Z`}
        fill={colours.faultLight}
        stroke={colours.fault}
        strokeWidth={2}
      />
      <line
        x1={r(x)}
        y1={r(y - s * 0.35)}
        x2={r(x)}
        y2={r(y + s * 0.3)}
        stroke={colours.fault}
        strokeWidth={2.5}
      />
      <circle cx={r(x)} cy={r(y + s * 0.6)} r={1.4} fill={colours.fault} />
    </g>
  );
}

/** A verdict line: the mark, then the words. */
/** The acceptance limit as a dashed copper line across the plot, named at one end. */
export function LimitLine({
  left,
  right,
  y,
  text,
  labelLeft,
}: {
  left: number;
  right: number;
  y: number;
  text: string;
  labelLeft: boolean;
}) {
  return (
    <>
      <line
        x1={left}
        y1={r(y)}
        x2={right}
        y2={r(y)}
        stroke={colours.copper}
        strokeWidth={2.5}
        strokeDasharray="9 5"
      />
      <Label
        x={labelLeft ? left + 8 : right - 4}
        y={r(y) - 6}
        halo
        text={text}
        size={13}
        anchor={labelLeft ? "start" : "end"}
        bold
        fill={colours.copper}
      />
    </>
  );
}

export function VerdictLine({
  x,
  y,
  pass,
  text,
  size = 15,
}: {
  x: number;
  y: number;
  pass: boolean;
  text: string;
  size?: number;
}) {
  return (
    <g>
      <VerdictMark x={x + 9} y={y - size * 0.35} pass={pass} size={size + 2} />
      <Label x={x + 26} y={y} text={text} size={size} bold fill={pass ? colours.sound : colours.fault} />
    </g>
  );
}

/** Coordinates rounded to a tenth: smaller markup, and no 1e-15 noise in the PDF. */
export function r(value: number): number {
  return Math.round(value * 10) / 10;
}

/** Evenly spaced "nice" tick values from 0 to at least `max` (1, 2, 2.5 or 5 × a power of ten). */
export function ticks(max: number, count = 4): number[] {
  if (!(max > 0)) return [0];
  const raw = max / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const values: number[] = [];
  for (let v = 0; v < max + step * 0.999; v += step) values.push(Number(v.toPrecision(10)));
  return values;
}

/** Words broken into at most `maxLines` lines of about `maxChars`, the last cut with an ellipsis. */
export function wrap(text: string, maxChars: number, maxLines = 2): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && `${line} ${word}`.length > maxChars) {
      lines.push(line);
      line = word;
    } else {
      line = line ? `${line} ${word}` : word;
    }
  }
  if (line) lines.push(line);
  if (lines.length <= maxLines && lines.every((l) => l.length <= maxChars)) return lines;
  const kept = lines.slice(0, maxLines).map((l) => (l.length > maxChars ? l.slice(0, maxChars - 1) : l));
  kept[kept.length - 1] = `${kept[kept.length - 1].slice(0, maxChars - 1).trimEnd()}…`;
  return kept;
}
