import { describe, expect, it } from "vitest";
import { takesSign } from "~/components/calculators/calc-fields";
import { flipSign } from "~/components/signed-input";
import { calculations, type CalcInputSpec } from "~/lib/calc";
import { takesNegative, type MeasureItem, type ReadingsItem } from "~/lib/templates";
import { itemOf, loadLibrary } from "./templates/fixtures";

/** Issue 15 §1: every signed field has a ± toggle; fields that are never negative have none. */
describe("the ± toggle", () => {
  it("flips the sign of what is typed, and starts a negative number on an empty field", () => {
    expect(flipSign("")).toBe("-");
    expect(flipSign("0.002")).toBe("-0.002");
    expect(flipSign("-0.002")).toBe("0.002");
    expect(flipSign("+3")).toBe("-3");
    expect(flipSign(flipSign("12.5"))).toBe("12.5");
  });

  it("is offered on the starter checklists' dial readings, temperatures and angles, not on gaps or sizes", () => {
    const library = loadLibrary();
    const find = (key: string, itemKey: string) =>
      itemOf(library.filter((t) => t.key === key).at(-1)!, itemKey) as MeasureItem | ReadingsItem;
    expect(takesNegative(find("propeller-shaft-and-coupling", "runout-readings"))).toBe(true);
    expect(takesNegative(find("engine-alignment", "rim-readings"))).toBe(true);
    expect(takesNegative(find("engine-alignment", "engine-angle"))).toBe(true);
    expect(takesNegative(find("cooling", "freeze-protection"))).toBe(true);
    expect(takesNegative(find("engine-alignment", "face-gaps"))).toBe(false); // rule: at least 0 in
    expect(takesNegative(find("propeller-shaft-and-coupling", "seat-roundness"))).toBe(false); // diameters
    expect(takesNegative(find("propeller-shaft-and-coupling", "face-runout"))).toBe(false); // TIR ≥ 0
    expect(takesNegative(find("propeller-shaft-and-coupling", "shaft-diameter"))).toBe(false);
  });

  it("is offered on the calculators' dial readings, offsets and angles, not on limits or sizes", () => {
    const signed = Object.entries(calculations as Record<string, { inputs: Record<string, CalcInputSpec> }>)
      .flatMap(([name, definition]) =>
        Object.entries(definition.inputs).flatMap(([input, spec]) =>
          takesSign(spec) ? [`${name}.${input}`] : [],
        ),
      )
      .sort();
    expect(signed).toEqual([
      "couplingRim.rim",
      "heeledHeight.heel",
      "installationAngle.measured",
      "installationAngle.runningTrim",
      "mountMoves.offsetHorizontal",
      "mountMoves.offsetVertical",
      "mountMoves.rim",
      "shaftRunout.readings",
    ]);
  });
});
