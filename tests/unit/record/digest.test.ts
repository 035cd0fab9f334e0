import { createHash } from "node:crypto";
import { describe, expect, test } from "vitest";
import { checklistCanonical, recordCanonical } from "~/lib/record/canonical";
import { checklistDigest, recordDigest, sha256Hex } from "~/lib/record/digest.server";
import type { CommissioningRecord, RecordChecklist } from "~/lib/record/types";
import type { Template } from "~/lib/templates";
import { commissioningRecordFixture } from "../../support/record-fixture";

/** SHA-256 computed here, apart from the code under test. */
const sha256 = (text: string) => createHash("sha256").update(Buffer.from(text, "utf8")).digest("hex");

test("sha256Hex gives the FIPS 180-2 answer for 'abc' (Appendix B.1)", () => {
  expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
});

// A small checklist written out by hand: one measure item read twice, a lead's comment, a photo.
const template: Template = {
  key: "face-check",
  version: 2,
  title: "Face check",
  purpose: "A test.",
  sections: [
    {
      key: "face",
      title: "Face",
      items: [
        {
          kind: "measure",
          key: "face-runout",
          label: "Face runout",
          required: true,
          unit: "in",
          rule: { max: 0.001, unit: "in" },
        },
      ],
    },
  ],
};
const first = { value: 0.0016, unit: "in", at: "2025-05-12T09:00:00Z", by: "Niamh Forde" } as const;
const second = { value: 0.0008, unit: "in", at: "2025-05-12T10:00:00Z", by: "Niamh Forde" } as const;
const small: RecordChecklist = {
  id: "c-1",
  templateKey: "face-check",
  templateVersion: 2,
  template,
  responses: {
    "face-runout": {
      value: { attempts: [first, second] },
      rev: 2,
      by: "Niamh Forde",
      at: "2025-05-12T10:00:00Z",
    },
  },
  // Deliberately out of order, as rows may come back from a query without ORDER BY.
  history: {
    "face-runout": [
      { rev: 2, value: { attempts: [first, second] }, by: "Niamh Forde", at: "2025-05-12T10:00:00Z" },
      { rev: 1, value: { attempts: [first] }, by: "Niamh Forde", at: "2025-05-12T09:00:00.000Z" },
    ],
  },
  comments: [
    { itemKey: "face-runout", by: "Róisín Keohane", at: "2025-05-12T11:00:00Z", text: "Re-faced: accepted." },
  ],
  photos: [{ itemKey: "face-runout", id: "0f7c1b6e-54a1-4d2b-9c3e-7a8b9c0d1e2f", sha256: "ab".repeat(32) }],
  submittedBy: "Niamh Forde",
  submittedAt: "2025-05-12T10:30:00Z",
  countersignedBy: "Róisín Keohane",
  countersignedAt: "2025-05-12T11:05:00Z",
  digest: "stored at countersigning; not part of what it is computed over",
};

// By hand from the definition (canonical.ts, checklistContent): keys in UTF-16 order at every
// level, revisions by number, the response and revision times in one ISO spelling, the values
// (and the times inside them) exactly as entered.
const A1 = '{"at":"2025-05-12T09:00:00Z","by":"Niamh Forde","unit":"in","value":0.0016}';
const A2 = '{"at":"2025-05-12T10:00:00Z","by":"Niamh Forde","unit":"in","value":0.0008}';
const smallText =
  '{"checklistId":"c-1",' +
  '"comments":[{"at":"2025-05-12T11:00:00.000Z","by":"Róisín Keohane","itemKey":"face-runout","text":"Re-faced: accepted."}],' +
  '"history":{"face-runout":[' +
  `{"at":"2025-05-12T09:00:00.000Z","by":"Niamh Forde","rev":1,"value":{"attempts":[${A1}]}},` +
  `{"at":"2025-05-12T10:00:00.000Z","by":"Niamh Forde","rev":2,"value":{"attempts":[${A1},${A2}]}}]},` +
  `"photos":[{"id":"0f7c1b6e-54a1-4d2b-9c3e-7a8b9c0d1e2f","itemKey":"face-runout","sha256":"${"ab".repeat(32)}"}],` +
  `"responses":{"face-runout":{"at":"2025-05-12T10:00:00.000Z","by":"Niamh Forde","rev":2,"value":{"attempts":[${A1},${A2}]}}},` +
  '"scheme":"sternpost-checklist-1","templateKey":"face-check","templateVersion":2}';

describe("the digest of a known checklist", () => {
  test("is the SHA-256 of the hand-written canonical text", () => {
    expect(checklistCanonical(small)).toBe(smallText);
    expect(checklistDigest(small)).toBe(sha256(smallText));
  });

  test("leaves out the stored digest and the signatures (they are made from it)", () => {
    const signedOtherwise = {
      ...small,
      digest: "",
      countersignedBy: "someone else",
      countersignedAt: "2026-01-01T00:00:00Z",
      submittedBy: undefined,
    };
    expect(checklistDigest(signedOtherwise)).toBe(checklistDigest(small));
  });
});

describe("the digest of a known record", () => {
  const record: CommissioningRecord = {
    record: { id: "r-1", issuedAt: "2025-06-02T10:15:00Z" },
    yardName: "Kittiwake Slip",
    vessel: {
      name: "Tern of Helvick",
      lengthValue: 34,
      lengthUnit: "ft",
      hullType: "semi-displacement",
      ownerName: "Declan Ó Briain",
    },
    job: {
      id: 214,
      scope: "repower",
      engineModel: "D4-80",
      engineSerial: "S-1",
      ratedPowerHp: 80,
      ratedRpmMin: 2800,
      ratedRpmMax: 3000,
      gearRatio: 2.47,
      propDiameterIn: 20,
      propPitchIn: 16,
      propBlades: 3,
      shaftDiameterIn: 1.25,
      shaftMaterial: "Duplex stainless",
      couplingType: "Solid flange",
      startDate: "2025-05-12",
      dueDate: null,
      leadName: "Róisín Keohane",
      technicianNames: ["Niamh Forde"],
    },
    checklists: [small],
    verifyUrl: "https://records.kittiwake-slip.example/verify/r-1",
  };
  const templateText =
    '{"key":"face-check","purpose":"A test.","sections":[{"items":[' +
    '{"key":"face-runout","kind":"measure","label":"Face runout","required":true,"rule":{"max":0.001,"unit":"in"},"unit":"in"}' +
    '],"key":"face","title":"Face"}],"title":"Face check","version":2}';
  const recordText =
    '{"checklists":[{' +
    `"content":${smallText},` +
    '"countersignedAt":"2025-05-12T11:05:00.000Z","countersignedBy":"Róisín Keohane",' +
    '"digest":"stored at countersigning; not part of what it is computed over",' +
    '"submittedAt":"2025-05-12T10:30:00.000Z","submittedBy":"Niamh Forde",' +
    `"template":${templateText}}],` +
    '"job":{"couplingType":"Solid flange","dueDate":null,"engineModel":"D4-80","engineSerial":"S-1","gearRatio":2.47,"id":214,' +
    '"leadName":"Róisín Keohane","propBlades":3,"propDiameterIn":20,"propPitchIn":16,"ratedPowerHp":80,"ratedRpmMax":3000,' +
    '"ratedRpmMin":2800,"scope":"repower","shaftDiameterIn":1.25,"shaftMaterial":"Duplex stainless","startDate":"2025-05-12",' +
    '"technicianNames":["Niamh Forde"]},' +
    '"record":{"id":"r-1","issuedAt":"2025-06-02T10:15:00.000Z"},' +
    '"scheme":"sternpost-record-1",' +
    '"vessel":{"hullType":"semi-displacement","lengthUnit":"ft","lengthValue":34,"name":"Tern of Helvick","ownerName":"Declan Ó Briain"},' +
    '"yardName":"Kittiwake Slip"}';

  test("is the SHA-256 of the hand-written canonical text, without the verification link", () => {
    expect(recordCanonical(record)).toBe(recordText);
    expect(recordDigest(record)).toBe(sha256(recordText));
    expect(recordDigest({ ...record, verifyUrl: "https://elsewhere.example/v" })).toBe(recordDigest(record));
  });
});

/** A copy of the realistic fixture to change one thing in. */
function fixture(): CommissioningRecord {
  return commissioningRecordFixture();
}
type Edit = (c: RecordChecklist) => void;
const shaftOf = (r: CommissioningRecord) => r.checklists[0];

describe("changing anything that was countersigned changes the checklist's digest", () => {
  const edits: [string, Edit][] = [
    [
      "a reading in the reported attempt",
      (c) => ((c.responses["runout-readings"].value as any).attempts[2].cells[2][2] = 2),
    ],
    [
      "an earlier straightening attempt",
      (c) => ((c.responses["runout-readings"].value as any).attempts[0].cells[2][2] = 0.0079),
    ],
    [
      "who took an attempt",
      (c) => ((c.responses["face-runout"].value as any).attempts[0].by = "Tadhg Mulcair"),
    ],
    [
      "when an attempt was taken",
      (c) => ((c.responses["face-runout"].value as any).attempts[1].at = "2025-05-12T11:59:00.000Z"),
    ],
    ["an attempt's unit", (c) => ((c.responses["rim-runout"].value as any).attempts[0].unit = "mm")],
    ["a corrective-action note", (c) => ((c.responses["rim-runout"].value as any).note += " ")],
    ["a check's result", (c) => ((c.responses["shaft-surface"].value as any).result = "na")],
    ["a response's revision", (c) => (c.responses["shaft-material"].rev = 2)],
    ["a response's author", (c) => (c.responses["shaft-material"].by = "Tadhg Mulcair")],
    ["a response's time", (c) => (c.responses["shaft-material"].at = "2025-05-12T07:38:00.000Z")],
    ["an entry in an item's history", (c) => ((c.history["stern-bearing"][0].value as any).result = "pass")],
    ["a revision dropped from the history", (c) => c.history["stern-bearing"].shift()],
    ["a response removed", (c) => delete c.responses["shaft-dressed"]],
    ["a comment's text", (c) => (c.comments[0].text = c.comments[0].text.replace("half", "a"))],
    ["a comment's author", (c) => (c.comments[1].by = "Niamh Forde")],
    ["a comment moved to another item", (c) => (c.comments[1].itemKey = "seal-installed")],
    [
      "a comment added",
      (c) =>
        c.comments.push({
          itemKey: "key-fit",
          by: "Róisín Keohane",
          at: "2025-05-13T09:00:00.000Z",
          text: "Fine.",
        }),
    ],
    [
      "a photo's digest",
      (c) => (c.photos[0].sha256 = c.photos[0].sha256.replace(/^./, (d) => (d === "0" ? "1" : "0"))),
    ],
    ["a photo removed", (c) => c.photos.pop()],
    ["the template version", (c) => (c.templateVersion = 2)],
    ["the template key", (c) => (c.templateKey = "engine-alignment")],
    ["the checklist", (c) => (c.id = "0b7d6c1e-2f4a-4e8b-9c3d-5a6b7c8d9e02")],
  ];
  test.each(edits)("%s", (_what, edit) => {
    const record = fixture();
    const before = checklistDigest(shaftOf(record));
    edit(shaftOf(record));
    expect(checklistDigest(shaftOf(record))).not.toBe(before);
  });
});

describe("what does not change the checklist's digest", () => {
  test("the order the comments, photos and revisions were read in", () => {
    const record = fixture();
    const c = shaftOf(record);
    const before = checklistDigest(c);
    c.comments.reverse();
    c.photos.reverse();
    for (const key of Object.keys(c.history)) c.history[key].reverse();
    c.responses = Object.fromEntries(Object.entries(c.responses).reverse());
    expect(checklistDigest(c)).toBe(before);
  });

  test("another spelling of the same instant", () => {
    const record = fixture();
    const c = shaftOf(record);
    const before = checklistDigest(c);
    c.responses["shaft-material"].at = c.responses["shaft-material"].at.replace(".000Z", "+00:00");
    expect(checklistDigest(c)).toBe(before);
  });

  test("a trip through JSON, as the value comes back from a JSON column", () => {
    const c = shaftOf(fixture());
    expect(checklistDigest(JSON.parse(JSON.stringify(c)))).toBe(checklistDigest(c));
    expect(c.digest).toBe(checklistDigest(c));
  });
});

describe("the record's digest covers the whole record", () => {
  const edits: [string, (r: CommissioningRecord) => void][] = [
    ["a reading", (r) => ((shaftOf(r).responses["face-runout"].value as any).attempts[1].value = 0.0009)],
    ["who countersigned", (r) => (shaftOf(r).countersignedBy = "Tadhg Mulcair")],
    ["when it was countersigned", (r) => (shaftOf(r).countersignedAt = "2025-05-12T15:10:00.000Z")],
    ["the stored checklist digest", (r) => (shaftOf(r).digest = "0".repeat(64))],
    ["a template's wording", (r) => (shaftOf(r).template.sections[0].items[0].label += ".")],
    ["the vessel's name", (r) => (r.vessel.name = "Tern of Dungarvan")],
    ["the engine serial", (r) => (r.job.engineSerial = "D480-0041978")],
    ["the order of the checklists", (r) => r.checklists.reverse()],
    ["the issue time", (r) => (r.record.issuedAt = "2025-06-02T10:16:00.000Z")],
  ];
  test.each(edits)("%s", (_what, edit) => {
    const record = fixture();
    const before = recordDigest(record);
    edit(record);
    expect(recordDigest(record)).not.toBe(before);
  });
});
