import { CAUTION_LIFTING, defineCalc } from "./define";
import { CalcError, requirePositive } from "./errors";
import { tidy } from "./numbers";

/** Common practice: a stack of more than about five shims under one foot goes spongy. */
export const DEFAULT_MAX_SHIM_PIECES = 5;
const MAX_STACK_IN = 10;
/** Work in tenths of a thou so sums of stock sizes are exact integers. */
const UNITS_PER_IN = 10_000;

export interface ShimStackInput {
  thicknessIn: number;
  /** Sizes on the shelf; any number of each may be used. */
  stockIn: number[];
  maxPieces?: number;
}

export interface ShimStackResult {
  pieces: { sizeIn: number; count: number }[];
  pieceCount: number;
  totalIn: number;
  /** totalIn − thicknessIn: how far the stack misses the wanted thickness. */
  differenceIn: number;
}

/**
 * The shim stack closest to the wanted thickness from the sizes a shop stocks, using as few
 * pieces as possible for that total (a small change-making search in 0.0001 in steps).
 */
export function shimStack(input: ShimStackInput): ShimStackResult {
  const thicknessIn = requirePositive("thicknessIn", input?.thicknessIn);
  if (thicknessIn > MAX_STACK_IN) {
    throw new CalcError("thicknessIn", `A shim stack over ${MAX_STACK_IN} in is a packing block, not shims.`);
  }
  if (!Array.isArray(input.stockIn) || input.stockIn.length === 0) {
    throw new CalcError("stockIn", "Enter the shim sizes the shop stocks.");
  }
  const sizes = [
    ...new Set(input.stockIn.map((s, i) => Math.round(requirePositive(`stockIn[${i}]`, s) * UNITS_PER_IN))),
  ];
  if (sizes.some((s) => s === 0)) {
    throw new CalcError("stockIn", "Shim sizes thinner than 0.0001 in cannot be stacked.");
  }
  const maxPieces =
    input.maxPieces === undefined
      ? DEFAULT_MAX_SHIM_PIECES
      : Math.max(1, Math.floor(requirePositive("maxPieces", input.maxPieces)));

  const target = Math.round(thicknessIn * UNITS_PER_IN);
  const ceiling = target + Math.max(...sizes);
  const fewest = new Array<number>(ceiling + 1).fill(Infinity);
  const lastPiece = new Array<number>(ceiling + 1).fill(0);
  fewest[0] = 0;
  for (let total = 1; total <= ceiling; total++) {
    for (const size of sizes) {
      if (size <= total && fewest[total - size] + 1 < fewest[total]) {
        fewest[total] = fewest[total - size] + 1;
        lastPiece[total] = size;
      }
    }
  }
  let best = 0;
  for (let total = 1; total <= ceiling; total++) {
    if (fewest[total] > maxPieces) continue;
    const miss = Math.abs(total - target);
    const bestMiss = Math.abs(best - target);
    if (miss < bestMiss || (miss === bestMiss && fewest[total] < fewest[best])) best = total;
  }
  const counts = new Map<number, number>();
  for (let total = best; total > 0; total -= lastPiece[total]) {
    counts.set(lastPiece[total], (counts.get(lastPiece[total]) ?? 0) + 1);
  }
  const pieces = [...counts.entries()]
    .sort((a, b) => b[0] - a[0])
    .map(([size, count]) => ({ sizeIn: size / UNITS_PER_IN, count }));
  const totalIn = best / UNITS_PER_IN;
  return { pieces, pieceCount: fewest[best], totalIn, differenceIn: tidy(totalIn - thicknessIn) };
}

export const shimStackCalc = defineCalc({
  name: "shimStack",
  title: "Shim stack",
  summary: "The fewest stock shims that make up a thickness.",
  source: "Shop stock sizes; at most 5 shims under a foot, common practice",
  caution: CAUTION_LIFTING,
  inputs: {
    thickness: { label: "Thickness wanted", accepts: ["number"], unit: "in", field: "thicknessIn" },
    stock: { label: "Shim sizes in stock", accepts: ["numbers"], unit: "in", field: "stockIn" },
    maxPieces: {
      label: "Most shims in one stack",
      accepts: ["number"],
      unit: "1",
      optional: true,
      field: "maxPieces",
    },
  },
  run(read, show) {
    const result = shimStack({
      thicknessIn: read.number("thickness", "in")!,
      stockIn: read.numbers("stock", "in")!,
      maxPieces: read.number("maxPieces", "1"),
    });
    return {
      values: {
        stack: result.pieces.map((p) => `${p.count} × ${show.q(p.sizeIn, "in")}`).join(" + "),
        total: result.totalIn,
        difference: result.differenceIn,
      },
      units: { total: "in", difference: "in" },
      verdict: "info",
      rule: "instructions, not a check: the closest total from the stock sizes, fewest pieces",
      detail: result,
    };
  },
});
