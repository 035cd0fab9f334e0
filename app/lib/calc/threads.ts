import { defineCalc } from "./define";
import { CalcError, requirePositive } from "./errors";
import { tidy } from "./numbers";

/**
 * ASME B1.1 Unified inch screw threads, coarse (UNC) and fine (UNF) series: threads per inch
 * by basic major diameter. Numbered sizes have major diameter 0.060 + 0.013 × number (in).
 */
const numbered = (n: number) => tidy(0.06 + 0.013 * n);
const UNC: [number, number][] = [
  [numbered(1), 64],
  [numbered(2), 56],
  [numbered(3), 48],
  [numbered(4), 40],
  [numbered(5), 40],
  [numbered(6), 32],
  [numbered(8), 32],
  [numbered(10), 24],
  [numbered(12), 24],
  [0.25, 20],
  [0.3125, 18],
  [0.375, 16],
  [0.4375, 14],
  [0.5, 13],
  [0.5625, 12],
  [0.625, 11],
  [0.75, 10],
  [0.875, 9],
  [1, 8],
  [1.125, 7],
  [1.25, 7],
  [1.375, 6],
  [1.5, 6],
  [1.75, 5],
  [2, 4.5],
  [2.25, 4.5],
  [2.5, 4],
  [2.75, 4],
  [3, 4],
  [3.25, 4],
  [3.5, 4],
  [3.75, 4],
  [4, 4],
];
const UNF: [number, number][] = [
  [numbered(0), 80],
  [numbered(1), 72],
  [numbered(2), 64],
  [numbered(3), 56],
  [numbered(4), 48],
  [numbered(5), 44],
  [numbered(6), 40],
  [numbered(8), 36],
  [numbered(10), 32],
  [numbered(12), 28],
  [0.25, 28],
  [0.3125, 24],
  [0.375, 24],
  [0.4375, 20],
  [0.5, 20],
  [0.5625, 18],
  [0.625, 18],
  [0.75, 16],
  [0.875, 14],
  [1, 12],
  [1.125, 12],
  [1.25, 12],
  [1.375, 12],
  [1.5, 12],
];
const SERIES = { UNC, UNF } as const;
/** Closest neighbours (#10 = 0.190 in, 3/16 = 0.1875 in) are 0.0025 in apart. */
const SIZE_SLACK_IN = 0.001;

export interface ThreadResult {
  tpi: number;
  /** Axial advance per turn of a single-start thread: 1 / tpi. */
  leadIn: number;
  /** The basic major diameter matched. */
  nominalIn: number;
}

/** Threads per inch of a Unified inch thread (ASME B1.1) and the lead of one turn. */
export function threadPitch(input: { nominalIn: number; series: "UNC" | "UNF" }): ThreadResult {
  const d = requirePositive("nominalIn", input?.nominalIn);
  const table = SERIES[input.series as keyof typeof SERIES];
  if (!table) throw new CalcError("series", 'Thread series is "UNC" (coarse) or "UNF" (fine).');
  const row = table.find(([nominal]) => Math.abs(nominal - d) <= SIZE_SLACK_IN);
  if (!row) {
    throw new CalcError("nominalIn", `No ${input.series} thread of ${d} in in ASME B1.1 as held here.`);
  }
  return { tpi: row[1], leadIn: tidy(1 / row[1]), nominalIn: row[0] };
}

export const threadPitchCalc = defineCalc({
  name: "threadPitch",
  title: "Unified thread pitch",
  summary: "Threads per inch and lead of a UNC or UNF thread.",
  source: "ASME B1.1",
  inputs: {
    nominal: { label: "Nominal diameter", accepts: ["number"], unit: "in", field: "nominalIn" },
    series: { label: "Series (UNC or UNF)", accepts: ["text"], field: "series" },
  },
  run(read) {
    const series = read.text("series")!.trim().toUpperCase();
    const result = threadPitch({ nominalIn: read.number("nominal", "in")!, series: series as "UNC" | "UNF" });
    return {
      values: { "threads per inch": result.tpi, lead: result.leadIn },
      units: { "threads per inch": "tpi", lead: "in" },
      verdict: "info",
      rule: `ASME B1.1 ${series} series`,
      detail: result,
    };
  },
});
