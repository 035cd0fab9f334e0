import { describe, expect, it } from "vitest";
import { jobSchema } from "~/lib/validation/jobs";

// Issue 12 §1.4: the shaft's system (inch or metric) and the DC system voltage are part of the
// job's equipment, so the checklists can pick DIN 6885-1 / ISO 4566 for metric shafts and take
// 12 V or 24 V for the electrical checks.
const job = {
  vesselId: "1",
  scope: "repower",
  engineModel: "Test",
  engineSerial: "SN1",
  ratedPowerHp: "75",
  ratedRpmMin: "3000",
  ratedRpmMax: "3200",
  gearRatio: "2.5",
  propDiameterIn: "18",
  propPitchIn: "14",
  propBlades: "3",
  shaftMaterial: "316",
  couplingType: "Solid",
  leadId: "2",
};

const issues = (input: object) =>
  Object.fromEntries(
    (jobSchema.safeParse(input).error?.issues ?? []).map((i) => [i.path.join("."), i.message]),
  );

describe("the job's shaft system and voltage", () => {
  it("defaults to an inch shaft on a 12 V system, as every job before them was", () => {
    const parsed = jobSchema.parse({ ...job, shaftDiameterIn: "1.25" });
    expect(parsed).toMatchObject({ shaftSystem: "inch", shaftDiameterIn: 1.25, systemVolts: 12 });
    expect(parsed.shaftDiameterMm).toBeUndefined();
  });

  it("keeps a metric shaft's millimetres and its inch equivalent (1 in = 25.4 mm exactly)", () => {
    const parsed = jobSchema.parse({
      ...job,
      shaftSystem: "metric",
      shaftDiameterMm: "35",
      systemVolts: "24",
    });
    // 35 / 25.4 = 1.377952… in, kept to 4 places.
    expect(parsed).toMatchObject({ shaftSystem: "metric", shaftDiameterMm: 35, shaftDiameterIn: 1.378 });
    expect(parsed.systemVolts).toBe(24);
  });

  it("asks for the diameter in the shaft's own system, and refuses other voltages", () => {
    expect(issues({ ...job, shaftSystem: "metric", shaftDiameterIn: "1.25" })).toEqual({
      shaftDiameterMm: "Enter the metric shaft's diameter in millimetres.",
    });
    expect(issues({ ...job, shaftSystem: "inch" })).toEqual({
      shaftDiameterIn: "Enter the shaft diameter in inches.",
    });
    expect(issues({ ...job, shaftDiameterIn: "1.25", systemVolts: "36" })).toEqual({
      systemVolts: "Choose 12 V or 24 V.",
    });
    expect(issues({ ...job, shaftDiameterIn: "1.25", shaftSystem: "imperial" }).shaftSystem).toBe(
      "Choose inch or metric.",
    );
  });
});
