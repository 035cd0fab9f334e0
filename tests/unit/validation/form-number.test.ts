import { describe, expect, it } from "vitest";
import { jobSchema } from "~/lib/validation/jobs";
import { formNumber } from "~/lib/validation/form-number";

const power = formNumber("the rated power", { min: 1, max: 5000, unit: "hp" });
const message = (value: unknown) => power.safeParse(value).error?.issues[0]?.message;

describe("a number typed in a form (issue 16)", () => {
  it("says the range for 99,999 hp instead of asking for a number", () => {
    // Reproduced with: "Enter the rated power as a number" for 99,999 on the job form.
    expect(message("99,999")).toBe("Enter the rated power between 1 and 5,000 hp.");
    expect(message("0")).toBe("Enter the rated power between 1 and 5,000 hp.");
    expect(power.parse("1,200")).toBe(1200);
  });

  it("reads a decimal comma as the decimal point it is in most of Europe", () => {
    const shaft = formNumber("the shaft diameter", { min: 0, above: true, max: 12, unit: "in" });
    expect(shaft.parse("1,25")).toBe(1.25);
    expect(shaft.parse("0,125")).toBe(0.125);
    expect(shaft.parse("1.25")).toBe(1.25);
  });

  it("says when the text is not a number, is missing, or must be whole", () => {
    expect(message("two hundred")).toBe("Enter the rated power as a number, like 12.5 or 12,5.");
    expect(message(undefined)).toBe("Enter the rated power.");
    const blades = formNumber("the number of blades", { min: 2, max: 7, whole: true });
    expect(blades.safeParse("3,5").error?.issues[0]?.message).toBe(
      "Enter the number of blades as a whole number.",
    );
  });

  it("takes the shaft diameter in millimetres on a metric job", () => {
    const parsed = jobSchema.safeParse({
      vesselId: "1",
      scope: "repower",
      engineModel: "K4-80",
      engineSerial: "SN-1",
      ratedPowerHp: "80",
      ratedRpmMin: "3000",
      ratedRpmMax: "3600",
      gearRatio: "2,47",
      propDiameterIn: "17",
      propPitchIn: "12",
      propBlades: "3",
      shaftSystem: "metric",
      shaftDiameterMm: "30",
      shaftMaterial: "Aquamet",
      couplingType: "Keyed",
      leadId: "2",
    });
    expect(parsed.error?.issues).toBeUndefined();
    expect(parsed.data).toMatchObject({ gearRatio: 2.47, shaftDiameterMm: 30 });
  });
});
