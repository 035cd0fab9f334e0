import { describe, expect, it } from "vitest";
import { CalcError, threadPitch } from "~/lib/calc";

// ASME B1.1, Unified inch screw threads, standard series table (coarse UNC, fine UNF);
// values from memory of the table, which Machinery's Handbook reprints.
describe("threadPitch — ASME B1.1", () => {
  it("coarse series", () => {
    const tpi = (nominalIn: number) => threadPitch({ nominalIn, series: "UNC" }).tpi;
    expect(tpi(0.25)).toBe(20);
    expect(tpi(0.3125)).toBe(18);
    expect(tpi(0.375)).toBe(16);
    expect(tpi(0.5)).toBe(13);
    expect(tpi(0.625)).toBe(11);
    expect(tpi(0.75)).toBe(10);
    expect(tpi(1)).toBe(8);
    expect(tpi(2)).toBe(4.5);
    expect(tpi(0.19)).toBe(24); // #10-24
    expect(tpi(0.138)).toBe(32); // #6-32
  });

  it("fine series", () => {
    const tpi = (nominalIn: number) => threadPitch({ nominalIn, series: "UNF" }).tpi;
    expect(tpi(0.25)).toBe(28);
    expect(tpi(0.375)).toBe(24);
    expect(tpi(0.5)).toBe(20);
    expect(tpi(0.75)).toBe(16);
    expect(tpi(1)).toBe(12);
    expect(tpi(0.19)).toBe(32); // #10-32
    expect(tpi(0.06)).toBe(80); // #0-80
  });

  it("lead of a single-start thread is 1 / tpi", () => {
    expect(threadPitch({ nominalIn: 0.25, series: "UNC" }).leadIn).toBe(0.05);
    expect(threadPitch({ nominalIn: 0.5, series: "UNC" }).leadIn).toBeCloseTo(1 / 13, 12);
  });

  it("names the field of an unknown size or series", () => {
    const field = (run: () => unknown) => {
      try {
        run();
      } catch (error) {
        return (error as CalcError).field;
      }
    };
    expect(field(() => threadPitch({ nominalIn: 0.1875, series: "UNC" }))).toBe("nominalIn"); // 3/16 is not a Unified size
    expect(field(() => threadPitch({ nominalIn: 0.5, series: "BSW" as "UNC" }))).toBe("series");
    expect(field(() => threadPitch({ nominalIn: 2, series: "UNF" }))).toBe("nominalIn");
  });
});
