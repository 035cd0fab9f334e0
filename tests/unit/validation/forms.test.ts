import { describe, expect, it } from "vitest";
import { jobSchema } from "~/lib/validation/jobs";
import { inviteSchema, newPasswordSchema } from "~/lib/validation/people";
import { vesselSchema } from "~/lib/validation/vessels";

const messages = (result: {
  success: boolean;
  error?: { issues: { path: PropertyKey[]; message: string }[] };
}) => Object.fromEntries((result.error?.issues ?? []).map((i) => [i.path.join("."), i.message]));

const vessel = {
  name: "Test hull",
  lengthValue: "34",
  lengthUnit: "ft",
  hullType: "planing",
  ownerName: "Owner",
};
const job = {
  vesselId: "1",
  scope: "repower",
  engineModel: "Test",
  engineSerial: "SN1",
  ratedPowerHp: "250",
  ratedRpmMin: "2700",
  ratedRpmMax: "2800",
  gearRatio: "2",
  propDiameterIn: "22",
  propPitchIn: "24",
  propBlades: "4",
  shaftDiameterIn: "1.5",
  shaftMaterial: "316",
  couplingType: "Split",
  leadId: "2",
};

describe("vessel form", () => {
  it("accepts a vessel without a HIN and normalises a typed HIN", () => {
    expect(vesselSchema.parse(vessel).hin).toBeUndefined();
    // 33 CFR 181.25: twelve characters; separators are not part of the number.
    expect(vesselSchema.parse({ ...vessel, hin: "ksb-4c017-j526" }).hin).toBe("KSB4C017J526");
  });

  it("names the field for each bad value", () => {
    const bad = messages(
      vesselSchema.safeParse({
        ...vessel,
        hin: "ABC123",
        lengthValue: "-3",
        hullType: "raft",
        ownerEmail: "nope",
      }),
    );
    expect(Object.keys(bad).sort()).toEqual(["hin", "hullType", "lengthValue", "ownerEmail"]);
    expect(bad.lengthValue).toBe("Enter the length overall above 0, up to 200.");
  });
});

describe("job form", () => {
  it("accepts a complete job and reads one or many technicians", () => {
    expect(jobSchema.parse(job).technicianIds).toEqual([]);
    expect(jobSchema.parse({ ...job, technicianIds: "5" }).technicianIds).toEqual([5]);
    expect(jobSchema.parse({ ...job, technicianIds: ["5", "6"] }).technicianIds).toEqual([5, 6]);
  });

  it("refuses an inverted rpm band, a gear ratio below 1:1 and a due date before the start", () => {
    const bad = messages(
      jobSchema.safeParse({
        ...job,
        ratedRpmMin: "2800",
        ratedRpmMax: "2600",
        gearRatio: "0",
        startDate: "2026-12-10",
        dueDate: "2026-12-01",
      }),
    );
    expect(bad.gearRatio).toMatch(/1:1/);
    expect(
      jobSchema.safeParse({ ...job, ratedRpmMin: "2800", ratedRpmMax: "2600" }).error?.issues[0]?.path,
    ).toEqual(["ratedRpmMax"]);
    expect(
      jobSchema.safeParse({ ...job, startDate: "2026-12-10", dueDate: "2026-12-01" }).error?.issues[0]?.path,
    ).toEqual(["dueDate"]);
  });

  it("refuses text where a number belongs", () => {
    expect(messages(jobSchema.safeParse({ ...job, propPitchIn: "twenty" })).propPitchIn).toMatch(/number/);
  });
});

describe("people forms", () => {
  it("check the invitation and the new password", () => {
    expect(inviteSchema.parse({ email: " New@Yard.Example ", name: "New Person", role: "lead" }).email).toBe(
      "new@yard.example",
    );
    expect(messages(inviteSchema.safeParse({ email: "x", name: "", role: "boss" }))).toHaveProperty("role");
    expect(
      messages(newPasswordSchema.safeParse({ password: "long-enough-1", confirm: "different" })).confirm,
    ).toMatch(/differ/);
    expect(messages(newPasswordSchema.safeParse({ password: "short", confirm: "short" })).password).toMatch(
      /10 characters/,
    );
  });
});
