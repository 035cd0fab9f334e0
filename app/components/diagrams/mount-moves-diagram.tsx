import type { MountMove, MountMovesResult } from "~/lib/calc";
import { Arrow, colours, DiagramFrame, fixed, formatLength, Label, r, type LengthUnit } from "./svg-kit";

export interface MountMovesDiagramProps {
  moves: MountMovesResult;
  /** Distances forward from the coupling face, as given to mountMoves. */
  frontMountIn: number;
  rearMountIn: number;
  lengthUnit?: LengthUnit;
}

const W = 640;
const H = 560;
const COUPLING_X = 510;
const FRONT_X = 236;
const ENGINE_LEFT = 60;

type End = "front" | "rear";

/** Words for one move: "raise 0.034 in", "0.44 turns to raise", "add shims 1 x 0.030 in". */
function moveWords(move: MountMove, len: (v: number) => string) {
  const vertical =
    move.raiseIn === 0
      ? "no raise or lower"
      : `${move.raiseIn > 0 ? "raise" : "lower"} ${len(Math.abs(move.raiseIn))}`;
  const sideways =
    move.toStarboardIn === 0
      ? "no move sideways"
      : `${len(Math.abs(move.toStarboardIn))} to ${move.toStarboardIn > 0 ? "starboard" : "port"}`;
  const turns =
    move.nutTurns === undefined || move.nutTurns === 0
      ? undefined
      : `${fixed(Math.abs(move.nutTurns), 2)} turns to ${move.nutTurns > 0 ? "raise" : "lower"}`;
  const number = (v: number) => len(v).replace(/ \S+$/, "");
  const unit = len(0).replace(/^\S+ /, "");
  const shims = move.shims
    ? {
        action: `${move.shims.action} ${move.shims.pieceCount} ${move.shims.pieceCount === 1 ? "shim" : "shims"}:`,
        stack: `${move.shims.pieces.map((p) => (p.count > 1 ? `${p.count} x ${number(p.sizeIn)}` : number(p.sizeIn))).join(" + ")} ${unit}`,
      }
    : undefined;
  return { vertical, sideways, turns, shims };
}

/**
 * The engine from the side and from above, bow to the left, with each pair of mounts' move as
 * an arrow and its size, nut turns and shims beside it. Arrow lengths are exaggerated; the words
 * carry the true numbers. The engine moves, the shaft stays.
 */
export function MountMovesDiagram({
  moves,
  frontMountIn,
  rearMountIn,
  lengthUnit = "in",
}: MountMovesDiagramProps) {
  const len = (v: number) => formatLength(v, lengthUnit);
  const scale = (COUPLING_X - FRONT_X) / frontMountIn;
  const xOf = (end: End) => COUPLING_X - (end === "front" ? frontMountIn : rearMountIn) * scale;
  const largest = Math.max(
    ...[moves.front, moves.rear].flatMap((m) => [Math.abs(m.raiseIn), Math.abs(m.toStarboardIn)]),
  );
  const arrowLength = (move: number, longest: number) =>
    largest > 0 ? 14 + (longest * Math.abs(move)) / largest : 0;
  const words = { front: moveWords(moves.front, len), rear: moveWords(moves.rear, len) };
  const name = { front: "Front mounts", rear: "Rear mounts" };
  const distance = { front: frontMountIn, rear: rearMountIn };

  // Front labels sit left of their arrow, rear labels right of theirs unless they would run past
  // `edge`: then left, which stays clear of the front ones because the front mounts are at FRONT_X.
  const labelAt = (end: End, room: number, edge: number) => {
    const x = xOf(end);
    if (end === "front") return { x: x - 14, anchor: "end" as const };
    return x + 14 + room <= edge
      ? { x: x + 14, anchor: "start" as const }
      : { x: x - 14, anchor: "end" as const };
  };

  const title = `Mount moves, the engine from the side and from above, bow to the left. ${(
    ["front", "rear"] as End[]
  )
    .map((end) => {
      const w = words[end];
      return `${name[end]}, ${len(distance[end])} forward of the coupling face: ${w.vertical}${w.turns ? ` (${w.turns})` : ""}, ${w.sideways}${w.shims ? `; ${w.shims.action} ${w.shims.stack}` : ""}`;
    })
    .join(". ")}. The engine moves, the shaft stays.`;

  return (
    <DiagramFrame width={W} height={H} title={title}>
      {/* Side view */}
      <Label x={16} y={26} text="From the side (bow to the left)" size={16} bold />
      <rect
        x={ENGINE_LEFT}
        y={70}
        width={380}
        height={90}
        rx={6}
        fill={colours.paper}
        stroke={colours.ink}
        strokeWidth={2}
      />
      <Label x={ENGINE_LEFT + 14} y={96} text="engine" size={13} fill={colours.inkSoft} />
      <rect
        x={440}
        y={88}
        width={COUPLING_X - 440 - 4}
        height={58}
        fill={colours.paper}
        stroke={colours.ink}
        strokeWidth={2}
      />
      <Label x={446} y={104} text="gear" size={12} fill={colours.inkSoft} />
      <rect x={COUPLING_X - 4} y={96} width={8} height={44} fill={colours.copper} />
      <rect x={COUPLING_X + 6} y={96} width={8} height={44} fill={colours.inkSoft} />
      <line x1={COUPLING_X + 14} y1={118} x2={W - 10} y2={118} stroke={colours.inkSoft} strokeWidth={9} />
      <Label x={W - 12} y={106} text="shaft (stays)" size={12} anchor="end" fill={colours.inkSoft} />
      <line x1={40} y1={184} x2={COUPLING_X} y2={184} stroke={colours.rule} strokeWidth={6} />
      <Label x={44} y={202} text="engine bed" size={12} fill={colours.inkSoft} />

      {(["front", "rear"] as End[]).map((end) => {
        const x = xOf(end);
        const move = moves[end];
        const w = words[end];
        const at = labelAt(end, 150, W);
        const length = arrowLength(move.raiseIn, 40);
        return (
          <g key={`side-${end}`}>
            <rect x={r(x - 14)} y={160} width={28} height={21} fill={colours.inkSoft} />
            {move.raiseIn === 0 ? (
              <circle cx={r(x)} cy={240} r={6} fill="none" stroke={colours.harbour} strokeWidth={2.5} />
            ) : move.raiseIn > 0 ? (
              <Arrow x1={x} y1={266} x2={x} y2={266 - length} colour={colours.harbour} />
            ) : (
              <Arrow x1={x} y1={212} x2={x} y2={212 + length} colour={colours.harbour} />
            )}
            <Label x={r(at.x)} y={226} text={name[end]} size={13} anchor={at.anchor} bold />
            <Label
              x={r(at.x)}
              y={243}
              text={w.vertical}
              size={13}
              anchor={at.anchor}
              bold
              fill={colours.harbour}
            />
            {w.turns && <Label x={r(at.x)} y={259} text={w.turns} size={12} anchor={at.anchor} />}
            {w.shims && <Label x={r(at.x)} y={275} text={w.shims.action} size={12} anchor={at.anchor} />}
            {w.shims && <Label x={r(at.x)} y={289} text={w.shims.stack} size={12} anchor={at.anchor} />}
          </g>
        );
      })}

      {(["front", "rear"] as End[]).map((end, i) => {
        const x = xOf(end);
        const y = 306 + i * 18;
        return (
          <g key={`distance-${end}`}>
            <line x1={r(x)} y1={y} x2={COUPLING_X} y2={y} stroke={colours.inkSoft} strokeWidth={1} />
            <line x1={r(x)} y1={y - 5} x2={r(x)} y2={y + 5} stroke={colours.inkSoft} strokeWidth={1.5} />
            <line
              x1={COUPLING_X}
              y1={y - 5}
              x2={COUPLING_X}
              y2={y + 5}
              stroke={colours.inkSoft}
              strokeWidth={1.5}
            />
            <Label
              x={r(x - 8)}
              y={y + 4}
              text={`${end}: ${len(distance[end])} forward`}
              size={12}
              anchor="end"
              fill={colours.inkSoft}
            />
          </g>
        );
      })}

      <Label x={COUPLING_X} y={342} text="coupling face" size={12} anchor="middle" fill={colours.inkSoft} />

      {/* Plan view */}
      <g transform="translate(0 20)">
        <Label x={16} y={352} text="From above (bow to the left)" size={16} bold />
        <Label x={ENGINE_LEFT} y={384} text="Starboard side" size={12} fill={colours.inkSoft} />
        <Label x={ENGINE_LEFT} y={486} text="Port side" size={12} fill={colours.inkSoft} />
        <rect
          x={ENGINE_LEFT}
          y={394}
          width={COUPLING_X - 4 - ENGINE_LEFT}
          height={76}
          rx={6}
          fill={colours.paper}
          stroke={colours.ink}
          strokeWidth={2}
        />
        <rect x={COUPLING_X - 4} y={408} width={8} height={48} fill={colours.copper} />
        <rect x={COUPLING_X + 6} y={408} width={8} height={48} fill={colours.inkSoft} />
        <line x1={COUPLING_X + 14} y1={432} x2={W - 10} y2={432} stroke={colours.inkSoft} strokeWidth={9} />

        {(["front", "rear"] as End[]).map((end) => {
          const x = xOf(end);
          const move = moves[end];
          const at = labelAt(end, 120, COUPLING_X - 6);
          const length = arrowLength(move.toStarboardIn, 26);
          return (
            <g key={`plan-${end}`}>
              <rect x={r(x - 8)} y={386} width={16} height={16} fill={colours.inkSoft} />
              <rect x={r(x - 8)} y={462} width={16} height={16} fill={colours.inkSoft} />
              {move.toStarboardIn === 0 ? (
                <circle cx={r(x)} cy={432} r={6} fill="none" stroke={colours.harbour} strokeWidth={2.5} />
              ) : move.toStarboardIn > 0 ? (
                <Arrow x1={x} y1={452} x2={x} y2={452 - length} colour={colours.harbour} />
              ) : (
                <Arrow x1={x} y1={412} x2={x} y2={412 + length} colour={colours.harbour} />
              )}
              <Label x={r(at.x)} y={428} text={name[end]} size={13} anchor={at.anchor} bold />
              <Label
                x={r(at.x)}
                y={445}
                text={words[end].sideways}
                size={13}
                anchor={at.anchor}
                bold
                fill={colours.harbour}
              />
            </g>
          );
        })}
      </g>

      <Label
        x={16}
        y={H - 30}
        text="The engine moves, the shaft stays. Arrows show each move, exaggerated; not to scale."
        size={12}
        fill={colours.inkSoft}
      />
      <Label
        x={16}
        y={H - 12}
        text="Support the engine before slackening a mount; tighten the lock nuts after each move."
        size={12}
        fill={colours.inkSoft}
      />
    </DiagramFrame>
  );
}
