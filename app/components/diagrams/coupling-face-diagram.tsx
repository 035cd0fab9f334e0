import type { ClockGapsIn, CouplingFaceResult } from "~/lib/calc";
import {
  colours,
  DiagramFrame,
  fixed,
  formatLength,
  Label,
  r,
  VerdictLine,
  type LengthUnit,
} from "./svg-kit";

export interface CouplingFaceDiagramProps {
  /** Feeler gaps between the faces; drawn as feelers whose lengths exaggerate the differences. */
  gapsIn?: ClockGapsIn;
  diameterIn?: number;
  /** couplingFace's result: the gap differences, slopes and verdict. */
  face?: CouplingFaceResult;
  /** The engine-side centre relative to the shaft-side centre (+ above, + to starboard), e.g. from couplingRim. */
  offset?: { verticalIn: number; horizontalIn: number; pass?: boolean; limitIn?: number };
  lengthUnit?: LengthUnit;
}

const W = 640;
const CX = 320;
const CY = 215;
const RADIUS = 105;
const LINE = 22;

/**
 * The coupling seen from aft, looking forward (port on the left, starboard on the right): the
 * four face gaps as feelers, the engine-side half dashed and shifted by its offset. Both are
 * exaggerated, and the words under the drawing give the true numbers.
 */
export function CouplingFaceDiagram({
  gapsIn,
  diameterIn,
  face,
  offset,
  lengthUnit = "in",
}: CouplingFaceDiagramProps) {
  const len = (v: number) => formatLength(v, lengthUnit);
  const perInch = (slope: number) =>
    lengthUnit === "mm"
      ? `${fixed(slope * 1000, 2)} mm per m of diameter`
      : `${fixed(slope * 1000, 2)} thou per inch of diameter`;
  const signed = (v: number) => (v > 0 ? `+${len(v)}` : len(v));

  const lines: { text: string; pass?: boolean }[] = [];
  if (face) {
    const v = face.verticalGapDiffIn;
    const h = face.horizontalGapDiffIn;
    const vWords = v > 0 ? "open at the top (nose low)" : v < 0 ? "open at the bottom (nose high)" : "level";
    const hWords =
      h > 0 ? "open to starboard (nose to port)" : h < 0 ? "open to port (nose to starboard)" : "level";
    lines.push({
      text: `Top minus bottom: ${signed(v)}, ${perInch(Math.abs(face.verticalSlope))} - ${vWords}`,
    });
    lines.push({
      text: `Starboard minus port: ${signed(h)}, ${perInch(Math.abs(face.horizontalSlope))} - ${hWords}`,
    });
    const limits = [
      face.limitInPerInDiameter !== undefined ? perInch(face.limitInPerInDiameter) : "",
      face.limitGapDiffIn !== undefined ? `${len(face.limitGapDiffIn)} difference` : "",
    ]
      .filter(Boolean)
      .join(" and ");
    lines.push({
      text: face.pass ? `Faces parallel: within ${limits}` : `Faces out of parallel: more than ${limits}`,
      pass: face.pass,
    });
  }
  if (offset) {
    const v = offset.verticalIn;
    const h = offset.horizontalIn;
    lines.push({
      text:
        v === 0 && h === 0
          ? "Centres in line"
          : `Engine centre ${len(Math.abs(v))} ${v >= 0 ? "above" : "below"}, ${len(Math.abs(h))} to ${h >= 0 ? "starboard" : "port"} of the shaft centre`,
    });
    if (offset.pass !== undefined) {
      const limit = offset.limitIn !== undefined ? ` ${len(offset.limitIn)} each way` : " the limit";
      lines.push({
        text: offset.pass ? `Offset within${limit}` : `Offset more than${limit}`,
        pass: offset.pass,
      });
    }
  }
  const H = 420 + lines.length * LINE + 24;

  const gapValues = gapsIn ? [gapsIn.top, gapsIn.bottom, gapsIn.port, gapsIn.starboard] : [];
  const least = Math.min(...gapValues);
  const most = Math.max(...gapValues);
  const feeler = (g: number) => (most > least ? 10 + (50 * (g - least)) / (most - least) : 30);

  const largest = Math.max(Math.abs(offset?.verticalIn ?? 0), Math.abs(offset?.horizontalIn ?? 0));
  const scale = largest > 0 ? 22 / largest : 0;
  const ex = CX + (offset?.horizontalIn ?? 0) * scale;
  const ey = CY - (offset?.verticalIn ?? 0) * scale;
  const ux = largest > 0 ? (ex - CX) / Math.hypot(ex - CX, ey - CY) : 0;
  const uy = largest > 0 ? (ey - CY) / Math.hypot(ex - CX, ey - CY) : 0;

  const title = [
    "Coupling seen from aft, looking forward",
    diameterIn !== undefined ? `diameter ${len(diameterIn)}` : "",
    gapsIn
      ? `face gaps: top ${len(gapsIn.top)}, bottom ${len(gapsIn.bottom)}, port ${len(gapsIn.port)}, starboard ${len(gapsIn.starboard)}`
      : "",
    ...lines.map((l) => l.text),
  ]
    .filter(Boolean)
    .join(". ");

  return (
    <DiagramFrame width={W} height={H} title={`${title}.`}>
      <Label x={16} y={26} text="Coupling seen from aft, looking forward" size={16} bold />
      <circle cx={CX} cy={CY} r={RADIUS} fill={colours.paper} stroke={colours.ink} strokeWidth={3} />
      <circle cx={CX} cy={CY} r={30} fill={colours.card} stroke={colours.inkSoft} strokeWidth={1.5} />
      {diameterIn !== undefined && (
        <Label
          x={CX}
          y={CY + 52}
          text={`diameter ${len(diameterIn)}`}
          size={12}
          anchor="middle"
          fill={colours.inkSoft}
        />
      )}

      {offset && largest > 0 && (
        <g>
          <circle
            cx={r(ex)}
            cy={r(ey)}
            r={RADIUS}
            fill="none"
            stroke={colours.harbour}
            strokeWidth={2.5}
            strokeDasharray="10 6"
          />
          <Cross x={ex} y={ey} colour={colours.harbour} />
          <Label
            x={r(ex + ux * 14)}
            y={r(ey + uy * 14 + 4)}
            text="engine centre"
            size={12}
            anchor={ux >= 0 ? "start" : "end"}
            bold
            fill={colours.harbour}
          />
          <Label
            x={r(CX - ux * 14)}
            y={r(CY - uy * 14 + 4)}
            text="shaft centre"
            size={12}
            anchor={ux >= 0 ? "end" : "start"}
            fill={colours.ink}
          />
        </g>
      )}
      <Cross x={CX} y={CY} colour={colours.ink} />

      {gapsIn ? (
        <g>
          <rect
            x={CX - 7}
            y={r(CY - RADIUS - feeler(gapsIn.top))}
            width={14}
            height={r(feeler(gapsIn.top))}
            fill={colours.brassLight}
            stroke={colours.brass}
            strokeWidth={2}
          />
          <Label
            x={CX}
            y={r(CY - RADIUS - feeler(gapsIn.top) - 8)}
            text={`Top ${len(gapsIn.top)}`}
            anchor="middle"
            bold
          />
          <rect
            x={CX - 7}
            y={CY + RADIUS}
            width={14}
            height={r(feeler(gapsIn.bottom))}
            fill={colours.brassLight}
            stroke={colours.brass}
            strokeWidth={2}
          />
          <Label
            x={CX}
            y={r(CY + RADIUS + feeler(gapsIn.bottom) + 20)}
            text={`Bottom ${len(gapsIn.bottom)}`}
            anchor="middle"
            bold
          />
          <rect
            x={r(CX - RADIUS - feeler(gapsIn.port))}
            y={CY - 7}
            width={r(feeler(gapsIn.port))}
            height={14}
            fill={colours.brassLight}
            stroke={colours.brass}
            strokeWidth={2}
          />
          <Label
            x={r(CX - RADIUS - feeler(gapsIn.port) - 8)}
            y={CY + 5}
            text={`Port ${len(gapsIn.port)}`}
            anchor="end"
            bold
          />
          <rect
            x={CX + RADIUS}
            y={CY - 7}
            width={r(feeler(gapsIn.starboard))}
            height={14}
            fill={colours.brassLight}
            stroke={colours.brass}
            strokeWidth={2}
          />
          <Label
            x={r(CX + RADIUS + feeler(gapsIn.starboard) + 8)}
            y={CY + 5}
            text={`Starboard ${len(gapsIn.starboard)}`}
            bold
          />
        </g>
      ) : (
        <g>
          <Label x={CX} y={CY - RADIUS - 12} text="Top" anchor="middle" bold />
          <Label x={CX} y={CY + RADIUS + 24} text="Bottom" anchor="middle" bold />
          <Label x={CX - RADIUS - 12} y={CY + 5} text="Port" anchor="end" bold />
          <Label x={CX + RADIUS + 12} y={CY + 5} text="Starboard" bold />
        </g>
      )}

      {lines.map((line, i) =>
        line.pass === undefined ? (
          <Label key={i} x={16} y={428 + i * LINE} text={line.text} size={13} />
        ) : (
          <VerdictLine key={i} x={16} y={428 + i * LINE} pass={line.pass} text={line.text} size={13} />
        ),
      )}
      <Label
        x={16}
        y={H - 12}
        text={`Seen from aft. ${gapsIn ? "Feelers: gap differences exaggerated. " : ""}${offset ? "Dashed: the engine's half, offset exaggerated. " : ""}Not to scale.`}
        size={12}
        fill={colours.inkSoft}
      />
    </DiagramFrame>
  );
}

function Cross({ x, y, colour }: { x: number; y: number; colour: string }) {
  return (
    <g>
      <line x1={r(x - 9)} y1={r(y)} x2={r(x + 9)} y2={r(y)} stroke={colour} strokeWidth={2} />
      <line x1={r(x)} y1={r(y - 9)} x2={r(x)} y2={r(y + 9)} stroke={colour} strokeWidth={2} />
    </g>
  );
}
