import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { Unit } from "~/lib/calc/units";
import { checklistDigest } from "~/lib/record/digest.server";
import type {
  CommissioningRecord,
  RecordChecklist,
  RecordComment,
  RecordPhoto,
  RecordRevision,
} from "~/lib/record/types";
import { evaluateAll, loadTemplateFile, placedItems, type Item, type Template } from "~/lib/templates";

/**
 * Builders for commissioning-record tests: a repower at Kittiwake Slip (an invented yard) on the
 * "Tern of Helvick" (an invented boat), with the starter templates filled the way a technician
 * fills them: every attempt kept, a failed check with its note, a lead's comments, photos.
 * Every person, boat, engine and number here is invented.
 */

const checklistsDir = fileURLToPath(new URL("../../checklists/", import.meta.url));

/** A starter template as the seed loads it. */
export function starterTemplate(key: string, version = 1): Template {
  const fileName = `${key}.v${version}.json`;
  return loadTemplateFile(fileName, readFileSync(checklistsDir + fileName, "utf8"));
}

export const people = {
  lead: "Róisín Keohane",
  technicians: ["Niamh Forde", "Tadhg Mulcair"],
  owner: "Declan Ó Briain",
} as const;

/** Minutes after a starting time, as the ISO strings the server writes. */
export class Clock {
  private time: number;
  constructor(start: string) {
    this.time = Date.parse(start);
  }
  next(minutes = 7): string {
    this.time += minutes * 60_000;
    return new Date(this.time).toISOString();
  }
}

/** One value an item was saved with, oldest first; the last is the response. */
export interface Step {
  value: unknown;
  by: string;
  at: string;
}

/** A measure item entered attempt by attempt: one saved revision per attempt, the note on the last. */
export function measureSteps(clock: Clock, by: string, unit: Unit, values: number[], note?: string): Step[] {
  const attempts: { value: number; unit: Unit; at: string; by: string }[] = [];
  return values.map((value, i) => {
    const at = clock.next(i === 0 ? 7 : 45);
    attempts.push({ value, unit, at, by });
    const last = i === values.length - 1;
    return { value: { attempts: [...attempts], ...(last && note ? { note } : {}) }, by, at };
  });
}

/** A readings grid entered set by set (each straightening or adjustment is a new set). */
export function readingsSteps(
  clock: Clock,
  by: string,
  sets: { unit: Unit; cells: (number | null)[][] }[],
  note?: string,
): Step[] {
  const attempts: { cells: (number | null)[][]; unit: Unit; at: string; by: string }[] = [];
  return sets.map((set, i) => {
    const at = clock.next(i === 0 ? 7 : 55);
    attempts.push({ cells: set.cells, unit: set.unit, at, by });
    const last = i === sets.length - 1;
    return { value: { attempts: [...attempts], ...(last && note ? { note } : {}) }, by, at };
  });
}

export function oneStep(clock: Clock, by: string, value: unknown): Step[] {
  return [{ value, by, at: clock.next() }];
}

/** A stand-in for an uploaded photo's bytes: its digest is fixed by its id. */
export function photoDigest(id: string): string {
  return createHash("sha256").update(`photo bytes of ${id}`).digest("hex");
}

function initialsOf(name: string): string {
  return name
    .split(/\s+/)
    .map((part) => part[0])
    .join("")
    .toUpperCase();
}

/** What a technician enters at an item the test does not spell out. */
function defaultValue(item: Item, by: string, at: string, photoIds: string[]): unknown {
  switch (item.kind) {
    case "check":
      return { result: "pass" };
    case "choice":
      return { option: item.options.find((o) => !o.needsNote)!.key };
    case "initials":
      return { initials: initialsOf(by), at, by };
    case "text":
      return { text: "Nothing further." };
    case "photo":
      return { photos: photoIds.map((id) => ({ id, sha256: photoDigest(id) })) };
    default:
      return undefined;
  }
}

export interface ChecklistSpec {
  id: string;
  template: Template;
  technician: string;
  clock: Clock;
  /** The items the test spells out; every other required item gets a plain entry (a calc item needs none). */
  steps: Record<string, Step[]>;
  /** Photo ids by photo item; a photo item not listed gets as many as it asks for. */
  photoIds?: Record<string, string[]>;
  comments?: Omit<RecordComment, "at">[];
}

/** A photo UUID fixed by where it was taken, so every build of a fixture is the same. */
function photoId(checklistId: string, itemKey: string, index: number): string {
  const h = createHash("sha256").update(`${checklistId}/${itemKey}/${index}`).digest("hex");
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-8${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/**
 * A submitted and countersigned checklist. Refuses to build one a lead could not have
 * countersigned: every required item done by the one rule evaluator, no entry that does not fit.
 */
export function countersignedChecklist(spec: ChecklistSpec): RecordChecklist {
  const { template, technician: by, clock } = spec;
  const history: Record<string, RecordRevision[]> = {};
  const photos: RecordPhoto[] = [];
  for (const { item } of placedItems(template)) {
    let steps = spec.steps[item.key];
    if (!steps && item.kind === "photo") {
      const ids =
        spec.photoIds?.[item.key] ??
        Array.from({ length: item.minPhotos }, (_, i) => photoId(spec.id, item.key, i));
      steps = oneStep(clock, by, defaultValue(item, by, "", ids));
    } else if (!steps && item.required && item.kind !== "calc") {
      const at = clock.next();
      const value = defaultValue(item, by, at, []);
      if (value === undefined)
        throw new Error(`the fixture must spell out ${template.key}/${item.key} (${item.kind})`);
      steps = [{ value, by, at }];
    }
    if (!steps) continue;
    history[item.key] = steps.map((step, i) => ({ rev: i + 1, ...step }));
    if (item.kind === "photo") {
      for (const photo of (steps.at(-1)!.value as { photos: { id: string }[] }).photos) {
        photos.push({ itemKey: item.key, id: photo.id, sha256: photoDigest(photo.id) });
      }
    }
  }
  const responses = Object.fromEntries(
    Object.entries(history).map(([key, revisions]) => {
      const last = revisions.at(-1)!;
      return [key, { value: last.value, rev: last.rev, by: last.by, at: last.at }];
    }),
  );

  const verdicts = evaluateAll(
    template,
    Object.fromEntries(Object.entries(responses).map(([k, r]) => [k, r.value])),
  );
  const problems = placedItems(template).flatMap(({ item }) => {
    const verdict = verdicts[item.key];
    if (verdict.status === "invalid" || (item.required && !verdict.done))
      return [`${item.key}: ${verdict.message}`];
    return [];
  });
  if (problems.length) throw new Error(`${template.key} could not be countersigned: ${problems.join(" | ")}`);

  const submittedAt = clock.next(30);
  const comments = (spec.comments ?? []).map((c) => ({ ...c, at: clock.next(4) }));
  const checklist: RecordChecklist = {
    id: spec.id,
    templateKey: template.key,
    templateVersion: template.version,
    template,
    responses,
    history,
    comments,
    photos,
    submittedBy: by,
    submittedAt,
    countersignedBy: people.lead,
    countersignedAt: clock.next(20),
    digest: "",
  };
  checklist.digest = checklistDigest(checklist);
  return checklist;
}

/** The propeller shaft and coupling checklist: the shaft straightened twice, a bearing replaced. */
export function shaftChecklist(): RecordChecklist {
  const clock = new Clock("2025-05-12T07:30:00Z");
  const tech = people.technicians[0];
  return countersignedChecklist({
    id: "0b7d6c1e-2f4a-4e8b-9c3d-5a6b7c8d9e01",
    template: starterTemplate("propeller-shaft-and-coupling"),
    technician: tech,
    clock,
    steps: {
      "shaft-material": oneStep(clock, tech, { option: "duplex-stainless" }),
      "seat-roundness": readingsSteps(clock, tech, [
        {
          unit: "in",
          cells: [
            [1.2512, 1.2514],
            [1.2513, 1.2512],
          ],
        },
      ]),
      "shaft-diameter": measureSteps(clock, tech, "in", [1.2512]),
      "runout-support": oneStep(clock, tech, { option: "lathe" }),
      "runout-readings": readingsSteps(clock, tech, [
        // As received: bowed at mid-length, 0.008 in TIR.
        {
          unit: "in",
          cells: [
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.002, 0.0045, 0.0025],
            [0, 0.0035, 0.008, 0.004],
            [0, 0.002, 0.005, 0.0025],
            [0, 0.0005, 0.0015, 0.001],
          ],
        },
        // After the first press: still 0.0035 in at mid-length.
        {
          unit: "in",
          cells: [
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.001, 0.002, 0.001],
            [0, 0.0015, 0.0035, 0.002],
            [0, 0.001, 0.0025, 0.001],
            [0, 0.0005, 0.001, 0.0005],
          ],
        },
        // After the second press, read in thousandths.
        {
          unit: "thou",
          cells: [
            [0, 0.5, 1, 0.5],
            [0, 0.5, 1, 0.5],
            [0, 1, 1.5, 0.5],
            [0, 0.5, 1, 0.5],
            [0, 0.5, 1, 0.5],
          ],
        },
      ]),
      straightening: oneStep(clock, tech, {
        option: "press",
        note: "Two presses at mid-length, supported 18 in either side.",
      }),
      "coupling-type": oneStep(clock, tech, { option: "keyed-straight" }),
      "coupling-bore": measureSteps(clock, tech, "in", [1.25]),
      "face-runout": measureSteps(clock, tech, "in", [0.0016, 0.0008]),
      "rim-runout": measureSteps(
        clock,
        tech,
        "thou",
        [2.4],
        "Spigot runout is in the supplied coupling itself: 0.0024 in on a new arbor too. The coupling maker's data sheet allows 0.003 in for this size; sheet filed with the job, lead consulted.",
      ),
      "seal-type": oneStep(clock, tech, { option: "face-seal" }),
      "stern-bearing": [
        { value: { result: "fail" }, by: tech, at: clock.next() },
        {
          value: {
            result: "fail",
            note: "Rubber stern bearing worn oval, 0.020 in play at the strut. Replaced with a new 1 1/4 in bearing; no play after.",
          },
          by: tech,
          at: clock.next(50),
        },
      ],
    },
    photoIds: { "locking-photo": ["c2d4e6f8-1a3b-4c5d-8e7f-90a1b2c3d4e5"] },
    comments: [
      {
        itemKey: "runout-readings",
        by: people.lead,
        text: "Checked the third set with my own dial at mid-length: agrees within half a thou.",
      },
      { itemKey: "stern-bearing", by: people.lead, text: "Old bearing kept in the job bin for the owner." },
    ],
  });
}

/** The engine alignment checklist: two rounds of mount moves afloat, re-checked after the sea trial. */
export function alignmentChecklist(): RecordChecklist {
  const clock = new Clock("2025-05-20T08:00:00Z");
  const tech = people.technicians[1];
  return countersignedChecklist({
    id: "4e9a1f2b-3c5d-4b6e-8f70-a1b2c3d4e5f6",
    template: starterTemplate("engine-alignment"),
    technician: tech,
    clock,
    steps: {
      "time-afloat": measureSteps(clock, tech, "h", [36]),
      "coupling-diameter": measureSteps(clock, tech, "in", [4]),
      "face-gaps": readingsSteps(clock, tech, [
        { unit: "in", cells: [[0.012, 0.004, 0.008, 0.008]] },
        { unit: "thou", cells: [[5, 3.5, 4.5, 4]] },
      ]),
      "rim-readings": readingsSteps(clock, tech, [
        { unit: "in", cells: [[0, 0.01, 0.006, 0.004]] },
        { unit: "in", cells: [[0, 0.002, 0.001, 0.001]] },
      ]),
      "front-mount-distance": measureSteps(clock, tech, "in", [34]),
      "rear-mount-distance": measureSteps(clock, tech, "in", [10.5]),
      "adjuster-tpi": measureSteps(clock, tech, "tpi", [13]),
      "recheck-gaps": readingsSteps(clock, tech, [{ unit: "thou", cells: [[4.5, 4, 4.5, 4]] }]),
    },
    comments: [
      {
        itemKey: "face-gaps",
        by: people.lead,
        text: "Second set taken with the boat in her usual trim: accepted.",
      },
    ],
  });
}

/** The whole record, as issued to a surveyor. */
export function commissioningRecordFixture(): CommissioningRecord {
  const id = "3f8e2b9a-6c1d-4e57-9a0b-2d7c4e1f6a38";
  return {
    record: { id, issuedAt: "2025-06-02T10:15:00.000Z" },
    yardName: "Kittiwake Slip",
    vessel: {
      name: "Tern of Helvick",
      hin: "KSL31007F405",
      lengthValue: 34,
      lengthUnit: "ft",
      hullType: "semi-displacement",
      ownerName: people.owner,
    },
    job: {
      id: 214,
      scope: "repower",
      engineModel: "Sternpost demo diesel D4-80",
      engineSerial: "D480-0041977",
      ratedPowerHp: 80,
      ratedRpmMin: 2800,
      ratedRpmMax: 3000,
      gearRatio: 2.47,
      propDiameterIn: 20,
      propPitchIn: 16,
      propBlades: 3,
      shaftDiameterIn: 1.25,
      shaftMaterial: "Duplex stainless",
      couplingType: "Solid flange, key and set screws",
      startDate: "2025-05-12",
      dueDate: "2025-06-06",
      leadName: people.lead,
      technicianNames: [...people.technicians],
    },
    checklists: [shaftChecklist(), alignmentChecklist()],
    verifyUrl: `https://records.kittiwake-slip.example/verify/${id}`,
  };
}
