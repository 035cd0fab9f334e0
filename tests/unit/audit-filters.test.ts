import { describe, expect, it } from "vitest";
import { actionInWords, auditActionGroups, auditFiltersSchema, startOfDayIn } from "~/lib/validation/audit";

const messages = (result: {
  success: boolean;
  error?: { issues: { path: PropertyKey[]; message: string }[] };
}) => Object.fromEntries((result.error?.issues ?? []).map((i) => [i.path.join("."), i.message]));

/** What a GET form sends: every field, the untouched ones empty. */
const blank = { action: "", person: "", entity: "", entityId: "", device: "", from: "", to: "", tz: "UTC" };

describe("audit log filters", () => {
  it("read an untouched form as no filter at all", () => {
    const f = auditFiltersSchema.parse(blank);
    expect(f).toMatchObject({ tz: "UTC" });
    for (const key of [
      "action",
      "person",
      "entity",
      "entityId",
      "device",
      "from",
      "to",
      "since",
      "until",
      "before",
    ] as const)
      expect(f[key]).toBeUndefined();
    expect(auditFiltersSchema.parse({}).tz).toBe("UTC");
  });

  it("accept one action, a family of actions, a person, a thing, a device and a page cursor", () => {
    const f = auditFiltersSchema.parse({
      ...blank,
      action: "checklist.countersigned",
      person: "7",
      entity: "checklist",
      entityId: " 3f1c2a9e-0000-4000-8000-000000000001 ",
      device: "tablet-aft-cabin-01",
      before: "1234",
    });
    expect(f).toMatchObject({
      action: "checklist.countersigned",
      person: 7,
      entity: "checklist",
      entityId: "3f1c2a9e-0000-4000-8000-000000000001",
      device: "tablet-aft-cabin-01",
      before: 1234,
    });
    expect(auditFiltersSchema.parse({ ...blank, action: "checklist." }).action).toBe("checklist.");
    expect(auditFiltersSchema.parse({ ...blank, action: "template.draft-saved" }).action).toBe(
      "template.draft-saved",
    );
  });

  it("turn whole days into instants in the reader's time zone, the last day included", () => {
    // From memory: US Eastern time is UTC-5 in winter and UTC-4 from the second Sunday of
    // March to the first Sunday of November (Energy Policy Act of 2005, 15 U.S.C. 260a).
    const f = auditFiltersSchema.parse({
      ...blank,
      from: "2026-01-15",
      to: "2026-07-01",
      tz: "America/New_York",
    });
    expect(f.since?.toISOString()).toBe("2026-01-15T05:00:00.000Z");
    expect(f.until?.toISOString()).toBe("2026-07-02T04:00:00.000Z");
    const oneDay = auditFiltersSchema.parse({ ...blank, from: "2026-05-04", to: "2026-05-04" });
    expect(oneDay.since?.toISOString()).toBe("2026-05-04T00:00:00.000Z");
    expect(oneDay.until?.toISOString()).toBe("2026-05-05T00:00:00.000Z");
  });

  it("read an unknown time zone as UTC rather than refuse the page", () => {
    const f = auditFiltersSchema.parse({ ...blank, from: "2026-05-04", tz: "Mars/Olympus_Mons" });
    expect(f.tz).toBe("UTC");
    expect(f.since?.toISOString()).toBe("2026-05-04T00:00:00.000Z");
  });

  it("name the field for each bad value", () => {
    const bad = messages(
      auditFiltersSchema.safeParse({
        action: "DROP TABLE audit_log",
        person: "Ana",
        entity: "job's",
        entityId: "12",
        device: "x".repeat(65),
        from: "2026-02-30",
        to: "yesterday",
        before: "-5",
      }),
    );
    expect(Object.keys(bad).sort()).toEqual(["action", "before", "device", "entity", "from", "person", "to"]);
    expect(bad.person).toMatch(/person from the list/);
    expect(bad.from).toMatch(/YYYY-MM-DD/);
  });

  it("refuse an id without its kind, a range that ends before it starts, and a fractional person", () => {
    expect(messages(auditFiltersSchema.safeParse({ ...blank, entityId: "12" }))).toEqual({
      entity: "Choose what kind of thing the id belongs to.",
    });
    expect(
      messages(auditFiltersSchema.safeParse({ ...blank, from: "2026-05-10", to: "2026-05-01" })),
    ).toEqual({ to: "The last day is before the first day." });
    expect(Object.keys(messages(auditFiltersSchema.safeParse({ ...blank, person: "2.5" })))).toEqual([
      "person",
    ]);
    expect(
      Object.keys(
        messages(auditFiltersSchema.safeParse({ ...blank, entityId: "12; DELETE", entity: "job" })),
      ),
    ).toEqual(["entityId"]);
    expect(Object.keys(messages(auditFiltersSchema.safeParse({ ...blank, action: "checklist" })))).toEqual([
      "action",
    ]);
  });
});

describe("start of a day in a time zone", () => {
  it("follows the clocks on the days they change", () => {
    // From memory: EU summer time starts on the last Sunday of March at 01:00 UTC
    // (Directive 2000/84/EC); Berlin is UTC+1 before and UTC+2 after. 2026-03-29 is that Sunday.
    expect(startOfDayIn("2026-03-29", "Europe/Berlin").toISOString()).toBe("2026-03-28T23:00:00.000Z");
    expect(startOfDayIn("2026-03-30", "Europe/Berlin").toISOString()).toBe("2026-03-29T22:00:00.000Z");
  });

  it("begins a day at the jump when the clocks skip midnight", () => {
    // From memory (IANA tz database rules): Lebanon (UTC+2) and Cuba (UTC-5) move their clocks
    // forward an hour at 00:00 local time, on the last Sunday of March and the second Sunday
    // of March; there is no midnight on those days and the day begins at the jump.
    expect(startOfDayIn("2026-03-29", "Asia/Beirut").toISOString()).toBe("2026-03-28T22:00:00.000Z");
    expect(startOfDayIn("2026-03-08", "America/Havana").toISOString()).toBe("2026-03-08T05:00:00.000Z");
  });
});

describe("action words", () => {
  it("say every known action in plain words and show an unknown code as stored", () => {
    expect(actionInWords("checklist.countersigned")).toBe("Countersigned a checklist");
    expect(actionInWords("photo.rotated")).toBe("photo.rotated");
    const grouped = auditActionGroups.flatMap((g) => g.actions);
    expect(grouped).toContain("record.viewed");
    expect(new Set(grouped).size).toBe(grouped.length);
  });
});
