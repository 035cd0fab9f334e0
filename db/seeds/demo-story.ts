import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { connect } from "../connect.ts";
import type { Role } from "../../app/lib/roles.ts";
import { SUBMIT_KEY, submitValue } from "../../app/lib/sync/submission.ts";
import type { Template } from "../../app/lib/templates/schema.ts";
import { startChecklists } from "../../app/server/checklists.server.ts";
import { findJob } from "../../app/server/jobs.server.ts";
import { prefillFromJob } from "../../app/server/prefill.server.ts";
import { createRecord } from "../../app/server/records.server.ts";
import { countersign } from "../../app/server/review.server.ts";
import { sync } from "../../app/server/sync.server.ts";
import { entriesFor, type Hand } from "./demo-entries.ts";
import { DEMO_PASSWORD } from "./demo-people.ts";

/**
 * The demo's story, so a newcomer sees every state in five minutes: on the completed "Little Auk"
 * every checklist is countersigned and the record is issued to the demo surveyor; on the repower
 * of "Tern of Helvick" the shaft has been straightened twice (the runout converging), the engine
 * aligned with its mount moves worked out, the exhaust waits for the lead's review, and two
 * tablets disagreed on a cooling item (a conflict to decide). Everything goes through the same
 * functions a yard's day goes through — sync, submission, countersigning, issuing — so the rows
 * are exactly what the app makes. All of it invented.
 */

interface Person {
  id: number;
  role: Role;
  name: string;
}

/** Minutes apart, ending now: entries read in the order they were made. */
function clockFrom(minutesAgo: number) {
  let at = Date.now() - minutesAgo * 60_000;
  return () => new Date((at += 60_000)).toISOString();
}

function handOf(person: Person, at: () => string): Hand {
  const initials = person.name
    .split(/\s+/)
    .map((w) => w[0])
    .join("")
    .toUpperCase();
  return { by: person.name, initials, at };
}

async function enter(
  person: Person,
  device: string,
  checklistId: string,
  entries: [string, unknown][],
  at: () => string,
) {
  const ops = entries.map(([itemKey, value], seq) => ({
    opId: randomUUID(),
    seq,
    checklistId,
    itemKey,
    value,
    baseRev: 0,
    at: at(),
  }));
  const answer = await sync(person, { deviceId: device, cursor: null, ops } as Parameters<typeof sync>[1]);
  const refused = answer.results.filter((r) => r.status === "rejected");
  if (refused.length) throw new Error(`demo entries refused: ${JSON.stringify(refused)}`);
  return answer;
}

async function templateOf(knex: Knex, checklistId: string): Promise<Template> {
  const row = await knex("job_checklists as c")
    .join("template_versions as t", "t.id", "c.template_version_id")
    .where("c.id", checklistId)
    .first("t.body");
  return typeof row.body === "string" ? JSON.parse(row.body) : row.body;
}

/** Readings as dial sets: each straightening or adjustment is a new set on the same item. */
const sets = (hand: Hand, unit: string, ...grids: number[][][]) => ({
  attempts: grids.map((cells) => ({ id: randomUUID(), cells, unit, at: hand.at(), by: hand.by })),
});
const measure = (hand: Hand, unit: string, value: number) => ({
  attempts: [{ id: randomUUID(), value, unit, at: hand.at(), by: hand.by }],
});

// ---- the completed job ----------------------------------------------------------------------

const COMPLETED_TEMPLATES = ["engine-alignment", "exhaust", "cooling", "sea-trial"];

/** The figures the plain entries cannot guess: each inside its rule, as a careful job reads. */
function completedFigures(key: string, hand: Hand): Record<string, unknown> {
  switch (key) {
    case "engine-alignment":
      return {
        "coupling-diameter": measure(hand, "in", 4),
        "face-gaps": sets(hand, "thou", [[4.5, 4, 4.5, 4]]),
        "face-gaps-180": sets(hand, "thou", [[4, 4.5, 4, 4.5]]),
        "rim-readings": sets(hand, "thou", [[0, 1, 0.5, 0.5]]),
        "front-mount-distance": measure(hand, "in", 26),
        "rear-mount-distance": measure(hand, "in", 8),
        "adjuster-tpi": measure(hand, "tpi", 13),
        "adjuster-pitch": measure(hand, "mm", 2),
        "engine-angle": measure(hand, "deg", 8),
        "running-trim": measure(hand, "deg", 3),
        "engine-max-angle": measure(hand, "deg", 14),
      };
    case "exhaust":
      return {
        "injection-height": measure(hand, "in", 9),
        "injection-off-centre": measure(hand, "in", 6),
        "heel-angle": measure(hand, "deg", 15),
        "injection-minimum": measure(hand, "in", 6),
      };
    case "cooling":
      // A 50/50 ethylene glycol mix protects to about −34 °F (from memory; the maker's chart governs).
      return { "freeze-protection": measure(hand, "degF", -34) };
    case "sea-trial":
      return {
        "wot-rpm": measure(hand, "rpm", 3900),
        "run-distance": measure(hand, "nmi", 1),
        "run-times": sets(hand, "s", [[205], [214]]),
      };
    default:
      return {};
  }
}

interface People {
  manager: Person;
  lead: Person;
  tech: Person;
}

async function completedJob(knex: Knex, jobId: number, people: People, surveyorEmail: string) {
  const job = (await findJob(jobId))!;
  const { lead, tech } = people;
  const ids = await startChecklists(job.id, COMPLETED_TEMPLATES, lead.id);
  await prefillFromJob(lead, job, ids);
  const at = clockFrom(60 * 24 * 40);
  for (const id of ids) {
    const template = await templateOf(knex, id);
    const hand = handOf(tech, at);
    const entries = entriesFor(template, hand, completedFigures(template.key, hand));
    await enter(tech, "demo-tablet-tobin", id, [...entries, [SUBMIT_KEY, submitValue]], at);
    await countersign(lead, id, DEMO_PASSWORD);
  }
  await createRecord(people.manager, job.id, [{ email: surveyorEmail }]);
}

// ---- the repower under way ------------------------------------------------------------------

async function repower(knex: Knex, jobId: number, people: People) {
  const checklists: { id: string; template_key: string }[] = await knex("job_checklists")
    .where({ job_id: jobId })
    .select("id", "template_key");
  const idOf = (key: string) => checklists.find((c) => c.template_key === key)!.id;
  const { lead, tech } = people;
  const at = clockFrom(60 * 24 * 6);
  const hand = handOf(tech, at);

  // The shaft as received was bowed 0.008 in at mid-length; two presses brought it to 0.0015 in.
  await enter(
    tech,
    "demo-tablet-tobin",
    idOf("propeller-shaft-and-coupling"),
    [
      ["shaft-material", { option: "duplex-stainless" }],
      ["shaft-surface", { result: "pass" }],
      ["shaft-diameter", measure(hand, "in", 1.5)],
      ["runout-support", { option: "lathe" }],
      [
        "runout-readings",
        sets(
          hand,
          "in",
          [
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.002, 0.0045, 0.0025],
            [0, 0.0035, 0.008, 0.004],
            [0, 0.002, 0.005, 0.0025],
            [0, 0.0005, 0.0015, 0.001],
          ],
          [
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.001, 0.002, 0.001],
            [0, 0.0015, 0.0035, 0.002],
            [0, 0.001, 0.0025, 0.001],
            [0, 0.0005, 0.001, 0.0005],
          ],
          [
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.001, 0.0015, 0.0005],
            [0, 0.0005, 0.001, 0.0005],
            [0, 0.0005, 0.001, 0.0005],
          ],
        ),
      ],
      ["straightening", { option: "press", note: "Two presses at mid-length, supported 18 in either side." }],
    ],
    at,
  );

  // Final alignment afloat: the first gaps open at the top, so the mounts move; the second set is close.
  await enter(
    tech,
    "demo-tablet-tobin",
    idOf("engine-alignment"),
    [
      ["beds-sound", { result: "pass" }],
      ["mounts-specified", { result: "pass" }],
      ["engine-set", { result: "pass" }],
      ["time-afloat", measure(hand, "h", 36)],
      ["coupling-diameter", measure(hand, "in", 5)],
      ["face-gaps", sets(hand, "in", [[0.012, 0.004, 0.008, 0.008]], [[0.005, 0.0035, 0.0045, 0.004]])],
      ["rim-readings", sets(hand, "in", [[0, 0.01, 0.006, 0.004]], [[0, 0.002, 0.001, 0.001]])],
      ["front-mount-distance", measure(hand, "in", 34)],
      ["rear-mount-distance", measure(hand, "in", 10.5)],
      ["adjuster-tpi", measure(hand, "tpi", 13)],
    ],
    at,
  );

  // The exhaust is done and waits for the lead.
  const exhaust = idOf("exhaust");
  const exhaustTemplate = await templateOf(knex, exhaust);
  const exhaustEntries = entriesFor(exhaustTemplate, hand, {
    "injection-height": measure(hand, "in", 11),
    "injection-minimum": measure(hand, "in", 6),
    "back-pressure": measure(hand, "inHg", 1.8),
    "back-pressure-limit": measure(hand, "inHg", 3),
  });
  await enter(tech, "demo-tablet-tobin", exhaust, [...exhaustEntries, [SUBMIT_KEY, submitValue]], at);

  // Cooling: the technician passes the strainer; the lead's tablet, offline since the morning,
  // sends a fail on the same revision. The server keeps the first and a conflict to decide.
  const cooling = idOf("cooling");
  await enter(
    tech,
    "demo-tablet-tobin",
    cooling,
    [
      ["seacock", { result: "pass" }],
      ["intake-hose", { result: "pass" }],
      ["strainer", { result: "pass" }],
    ],
    at,
  );
  const answer = await enter(
    lead,
    "demo-tablet-idris",
    cooling,
    [["strainer", { result: "fail", note: "Strainer lid gasket weeps at idle; a new gasket is on order." }]],
    at,
  );
  if (answer.results[0]?.status !== "conflict") throw new Error("the demo conflict was not made");
}

/** Runs the story once, on the rows seedDemo made; a database that has it already is left alone. */
export async function seedDemoStory(knex: Knex): Promise<string> {
  const completed = await knex("jobs").where({ status: "completed" }).first("id");
  const underway = await knex("jobs").where({ status: "underway" }).first("id");
  if (!completed || !underway) return "no demo jobs to tell the story on";
  if (
    (await knex("records").first()) ||
    (await knex("job_checklists").where({ job_id: completed.id }).first())
  )
    return "story already told";
  const byEmail = async (email: string): Promise<Person> =>
    knex("users").where({ email }).first("id", "role", "name");
  const people: People = {
    manager: await byEmail("manager@kittiwake-slip.example"),
    lead: await byEmail("lead@kittiwake-slip.example"),
    tech: await byEmail("tech@kittiwake-slip.example"),
  };
  // The app's functions read the database through db() and the sync applier through
  // applierDb(); for the story both are the seed's.
  const previous = [globalThis.__sternpostDb, globalThis.__sternpostApplierDb] as const;
  const { uri } = knex.client.config.connection as { uri: string };
  const applier = connect(uri, { severalStatements: true });
  globalThis.__sternpostDb = knex;
  globalThis.__sternpostApplierDb = applier;
  try {
    await completedJob(knex, completed.id, people, "surveyor@harbourmark-survey.example");
    await repower(knex, underway.id, people);
  } finally {
    [globalThis.__sternpostDb, globalThis.__sternpostApplierDb] = previous;
    await applier.destroy();
  }
  return "the completed job issued, the repower under way, a review and a conflict waiting";
}
