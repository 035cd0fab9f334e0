import { couplingRim, faceGaps, faceReadingInputs, readGaps, type ClockGapsIn } from "./coupling";
import { CAUTION_LIFTING, defineCalc, type Show } from "./define";
import { CalcError, requireFinite, requireFiniteResult, requireNonNegative, requirePositive } from "./errors";
import { tidy } from "./numbers";
import { shimStack, type ShimStackResult } from "./shims";

export interface MountMovesInput {
  /** Diameter of the circle the face gaps were measured on (the coupling diameter). */
  diameterIn: number;
  gapsIn: ClockGapsIn;
  /** Engine-side coupling centre relative to the shaft-side centre: + above / + to starboard. */
  offsetIn: { vertical: number; horizontal: number };
  /** Distance forward from the coupling face to the front mounts. */
  frontMountIn: number;
  /** Distance forward from the coupling face to the rear mounts. */
  rearMountIn: number;
  /** Threads per inch of the mount's adjusting stud; gives nut turns when present. */
  adjusterTpi?: number;
  /** Shim sizes the shop stocks; gives a shim stack for each vertical move when present. */
  shimStockIn?: number[];
}

export interface MountMove {
  /** + raise this pair of mounts, − lower it. */
  raiseIn: number;
  /** + move this end of the engine to starboard, − to port. */
  toStarboardIn: number;
  /** raiseIn × threads per inch; + means the turns that raise the engine on that mount. */
  nutTurns?: number;
  /** Shims to add (raise) or take out (lower) to make the vertical move, from the stock sizes. */
  shims?: { action: "add" | "remove" } & ShimStackResult;
}

export interface MountMovesResult {
  front: MountMove;
  rear: MountMove;
}

/**
 * Mount moves that bring the coupling faces parallel and the centres in line, by similar
 * triangles (rim-and-face alignment as taught in millwright practice: the move at a foot is the
 * offset plus the face slope times the foot's distance from the coupling).
 *
 * Conventions: the engine moves, the shaft does not. Distances run forward from the coupling
 * face. `offsetIn.vertical` is how far the engine-side centre sits above the shaft-side centre
 * (negative = below); `offsetIn.horizontal` how far it sits to starboard. A gap larger at the
 * top means the engine's nose is low (its axis falls going forward by (top − bottom) ÷ diameter
 * per inch); a gap larger to starboard means the nose points to port.
 *
 *   raise at a mount       = (top − bottom) / D × distance − vertical offset
 *   to starboard at a mount = (starboard − port) / D × distance − horizontal offset
 *   nut turns              = raise × adjuster threads per inch
 *
 * Small angles are assumed (gap differences are thousandths over inches), as in the
 * handbooks. Caution: support the engine before loosening mounts, isolate it so it cannot start
 * while the shaft is turned by hand, and follow the engine maker's installation instructions.
 */
export function mountMoves(input: MountMovesInput): MountMovesResult {
  const diameterIn = requirePositive("diameterIn", input?.diameterIn);
  const gaps = readGaps("gapsIn", input.gapsIn);
  if (!input.offsetIn || typeof input.offsetIn !== "object") {
    throw new CalcError(
      "offsetIn",
      "Enter the centre offset (vertical and horizontal); enter 0 if the centres are in line.",
    );
  }
  const offsetV = requireFinite("offsetIn.vertical", input.offsetIn.vertical);
  const offsetH = requireFinite("offsetIn.horizontal", input.offsetIn.horizontal);
  const rearMountIn = requireNonNegative("rearMountIn", input.rearMountIn);
  const frontMountIn = requirePositive("frontMountIn", input.frontMountIn);
  if (frontMountIn <= rearMountIn) {
    throw new CalcError(
      "frontMountIn",
      "The front mounts must be farther forward of the coupling than the rear mounts.",
    );
  }
  const tpi = input.adjusterTpi === undefined ? undefined : requirePositive("adjusterTpi", input.adjusterTpi);
  const stock = input.shimStockIn;

  const verticalSlope = (gaps.top - gaps.bottom) / diameterIn;
  const horizontalSlope = (gaps.starboard - gaps.port) / diameterIn;

  const moveAt = (distanceIn: number): MountMove => {
    const raiseIn = tidy(verticalSlope * distanceIn - offsetV);
    const move: MountMove = { raiseIn, toStarboardIn: tidy(horizontalSlope * distanceIn - offsetH) };
    if (tpi !== undefined) move.nutTurns = tidy(raiseIn * tpi);
    requireFiniteResult("diameterIn", move);
    if (stock !== undefined && raiseIn !== 0) {
      move.shims = {
        action: raiseIn > 0 ? "add" : "remove",
        ...shimStack({ thicknessIn: Math.abs(raiseIn), stockIn: stock }),
      };
    }
    return move;
  };
  return { front: moveAt(frontMountIn), rear: moveAt(rearMountIn) };
}

/** A move in words whose sign and direction agree with the arrow in the diagram. */
function moveWords(value: number, positive: string, negative: string, show: Show): string {
  if (value === 0) return "no move";
  return `${value > 0 ? positive : negative} ${show.q(Math.abs(value), "in")}`;
}

function turnsWords(turns: number): string {
  const n = Math.round(Math.abs(turns) * 100) / 100;
  if (n === 0) return "no turn";
  return `${n} ${n === 1 ? "turn" : "turns"} to ${turns > 0 ? "raise" : "lower"}`;
}

export const mountMovesCalc = defineCalc({
  name: "mountMoves",
  title: "Mount moves",
  summary:
    "How far to raise or shift each pair of mounts to bring the faces parallel and the centres in line.",
  source: "Similar triangles, rim-and-face alignment: move = face slope × distance − offset",
  caution: CAUTION_LIFTING,
  inputs: {
    ...faceReadingInputs,
    offsetVertical: {
      label: "Engine centre above shaft centre",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "offsetIn.vertical",
    },
    offsetHorizontal: {
      label: "Engine centre to starboard of shaft centre",
      accepts: ["number"],
      unit: "in",
      optional: true,
      field: "offsetIn.horizontal",
    },
    rim: {
      label: "Rim readings (instead of the offsets)",
      accepts: ["grid", "numbers"],
      unit: "in",
      optional: true,
      field: "readingsIn",
      clock: true,
    },
    frontMount: {
      label: "Coupling face to front mounts",
      accepts: ["number"],
      unit: "in",
      field: "frontMountIn",
    },
    rearMount: {
      label: "Coupling face to rear mounts",
      accepts: ["number"],
      unit: "in",
      field: "rearMountIn",
    },
    adjusterThread: {
      label: "Mount adjuster threads per inch",
      accepts: ["number"],
      unit: "tpi",
      optional: true,
      field: "adjusterTpi",
    },
    adjusterPitch: {
      label: "Mount adjuster thread pitch (metric, mm per turn)",
      accepts: ["number"],
      unit: "mm",
      optional: true,
    },
    shimStock: {
      label: "Shim sizes in stock",
      accepts: ["numbers"],
      unit: "in",
      optional: true,
      field: ["shimStockIn", "thicknessIn", "stockIn"],
    },
  },
  run(read, show) {
    const gapsIn = faceGaps(read.clock("gaps", "in"), read.clock("gaps180", "in"));
    const rim = read.clock("rim", "in");
    const fromRim = rim ? couplingRim({ readingsIn: rim }) : undefined;
    const vertical = read.number("offsetVertical", "in") ?? fromRim?.verticalOffsetIn;
    const horizontal = read.number("offsetHorizontal", "in") ?? fromRim?.horizontalOffsetIn;
    if (vertical === undefined)
      throw new CalcError("offsetVertical", "Enter the vertical centre offset or the rim readings.");
    if (horizontal === undefined)
      throw new CalcError("offsetHorizontal", "Enter the sideways centre offset or the rim readings.");
    const tpi = read.number("adjusterThread", "tpi");
    const pitchIn = read.number("adjusterPitch", "in");
    if (pitchIn !== undefined && pitchIn <= 0)
      throw new CalcError("adjusterPitch", "The thread pitch must be greater than zero.");
    const result = mountMoves({
      diameterIn: read.number("diameter", "in")!,
      gapsIn,
      offsetIn: { vertical, horizontal },
      frontMountIn: read.number("frontMount", "in")!,
      rearMountIn: read.number("rearMount", "in")!,
      adjusterTpi: tpi ?? (pitchIn !== undefined ? 1 / pitchIn : undefined),
      shimStockIn: read.numbers("shimStock", "in"),
    });
    const values: Record<string, string> = {};
    for (const [end, move] of [
      ["front", result.front],
      ["rear", result.rear],
    ] as const) {
      values[`${end} mounts, height`] = moveWords(move.raiseIn, "raise", "lower", show);
      values[`${end} mounts, sideways`] = moveWords(move.toStarboardIn, "to starboard", "to port", show);
      if (move.nutTurns !== undefined) values[`${end} adjusting nuts`] = turnsWords(move.nutTurns);
      if (move.shims)
        values[`${end} shims`] =
          `${move.shims.action} ${move.shims.pieces.map((p) => `${p.count} × ${show.q(p.sizeIn, "in")}`).join(" + ")}`;
    }
    return {
      values,
      units: {},
      verdict: "info",
      rule: "instructions, not a check: the engine moves, the shaft stays; distances forward from the coupling face. Whether the alignment is good is the face and rim check's verdict",
      detail: result,
    };
  },
});
