import "fake-indexeddb/auto";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { forgetLocalDb } from "~/lib/offline/db.client";
import { readChecklist, recordEntry, saveBundle } from "~/lib/offline/store.client";
import { syncOnce } from "~/lib/offline/sync.client";
import { sameJson } from "~/lib/sync/protocol";
import { startChecklists } from "~/server/checklists.server";
import { seedLibrary } from "../../db/seeds/library.ts";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";

/**
 * A model test of offline sync: several devices edit the same checklist while apart and sync
 * through the real /api/sync route (the production build's handler) into MariaDB, over a network
 * that drops requests, loses answers after the server committed, duplicates requests and replays
 * old ones. Afterwards nothing is lost, nothing is applied twice, and every device agrees with
 * the server. The devices are the tablet's own code (store.client.ts and sync.client.ts over
 * fake-indexeddb), so a divergence of a tablet's copy from the server is caught too. Besides
 * scalar answers, devices add measurement attempts to one item at the same time: afterwards every
 * attempt from every device is in the item, once (issue 13 §4).
 *
 * `npm test` runs a short model; `npm run test:sync-long` runs it for minutes (SYNC_MODEL_SECONDS,
 * default 600) over as many histories as fit, and prints how many it covered.
 */
const LONG_SECONDS = Number(process.env.SYNC_MODEL_SECONDS ?? 0);
const RUNS = LONG_SECONDS ? 1_000_000 : 25;

const knex = testDb();
afterAll(() => knex.destroy());
const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);

const ITEMS = ["seacock", "strainer", "impeller", "thermostat"] as const;
const valueArb = fc.oneof(
  fc.constant({ result: "pass" }),
  fc
    .constantFrom("Weeping at the flange", "Replaced", "Seized handle")
    .map((note) => ({ result: "fail", note })),
  fc.constant({ result: "na", note: "Not fitted on this boat" }),
);
const LOG_ITEM = "coolant-temperature-cruise";
type Fault = "none" | "drop" | "lose-answer" | "duplicate" | "replay-old";
const stepArb = fc.oneof(
  {
    weight: 3,
    arbitrary: fc.record({
      kind: fc.constant("edit" as const),
      device: fc.nat(2),
      item: fc.constantFrom(...ITEMS),
      value: valueArb,
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("attempt" as const),
      device: fc.nat(2),
      value: fc.integer({ min: 150, max: 210 }),
      minutes: fc.nat(120),
    }),
  },
  {
    weight: 2,
    arbitrary: fc.record({
      kind: fc.constant("sync" as const),
      device: fc.nat(2),
      fault: fc.constantFrom<Fault>("none", "drop", "lose-answer", "duplicate", "replay-old"),
    }),
  },
);

let app: Awaited<ReturnType<typeof appHandler>>;
let people: Awaited<ReturnType<typeof makeUser>>[];
let cookies: string[];
beforeAll(async () => {
  await seedLibrary(knex);
  app = await appHandler();
  // The same crew and sessions serve every history: signing in is the dearest part of a set-up.
  const lead = await makeUser(knex, "lead");
  people = [await makeUser(knex, "technician"), await makeUser(knex, "technician"), lead];
  cookies = await Promise.all(people.map((p) => signInCookie(app, p.email)));
});

let run = 0;
let histories = 0;
let lastJob: number | null = null;

/** Each history starts on a fresh job and checklist; the last history's are removed first. */
async function setUpRun() {
  run++;
  if (lastJob !== null) {
    const ids = knex("job_checklists").where({ job_id: lastJob }).select("id");
    for (const table of ["response_history", "sync_conflicts", "sync_ops"])
      await knex(table).whereIn("checklist_id", ids).delete();
    await knex("job_checklists").where({ job_id: lastJob }).delete();
    await knex("job_technicians").where({ job_id: lastJob }).delete();
    await knex("jobs").where({ id: lastJob }).delete();
  }
  const [lead, ...techs] = [people[2]!, people[0]!, people[1]!];
  const job = await makeJob(
    knex,
    lead.id,
    techs.map((t) => t.id),
  );
  lastJob = job.id;
  const [checklist] = await startChecklists(job.id, ["cooling"], lead.id);
  const devices = people.map((_, i) => ({
    name: `model-${run}-${i}`,
    cookie: cookies[i]!,
    lastBody: null as string | null,
  }));
  const bundles = await Promise.all(
    devices.map(async (d) => (await app("/api/offline", { cookie: d.cookie })).json()),
  );
  for (const [i, d] of devices.entries()) {
    forgetLocalDb(d.name); // one device's database at a time: the store module holds one
    await saveBundle(bundles[i]);
  }
  return { checklist: checklist!, devices };
}

/** A fetch through the app's handler for one device, misbehaving as the step says. */
function network(device: { cookie: string; lastBody: string | null }, fault: Fault): typeof fetch {
  return (async (_url: string, init: RequestInit) => {
    const body = String(init.body);
    const send = (b: string) =>
      app("/api/sync", {
        method: "POST",
        body: b,
        headers: { "Content-Type": "application/json" },
        cookie: device.cookie,
      });
    const previous = device.lastBody;
    device.lastBody = body;
    switch (fault) {
      case "drop":
        throw new TypeError("network dropped the request");
      case "lose-answer":
        await send(body);
        throw new TypeError("the answer was lost");
      case "duplicate":
        await send(body);
        return send(body);
      case "replay-old":
        if (previous) await send(previous);
        return send(body);
      default:
        return send(body);
    }
  }) as typeof fetch;
}

describe("offline sync under a bad network (model test)", () => {
  it(
    "keeps every edit, applies each once, and converges",
    async () => {
      await fc.assert(
        fc.asyncProperty(fc.array(stepArb, { minLength: 5, maxLength: 30 }), async (steps) => {
          const { checklist, devices } = await setUpRun();
          histories++;
          const made: { opId: string; item: string; value: unknown }[] = [];
          const attempts: string[] = [];
          for (const step of steps) {
            const device = devices[step.device]!;
            forgetLocalDb(device.name);
            if (step.kind === "edit") {
              const entry = await recordEntry(checklist, step.item, step.value, `device ${step.device}`);
              made.push({ opId: entry.opId, item: step.item, value: step.value });
            } else if (step.kind === "attempt") {
              // As the measure editor does: the attempts this tablet shows, and one more.
              const shown = (await readChecklist(checklist))!.responses[LOG_ITEM]?.value as
                { attempts: object[] } | undefined;
              const attempt = {
                id: crypto.randomUUID(),
                value: step.value,
                unit: "degF",
                at: new Date(Date.UTC(2026, 4, 1, 9, step.minutes)).toISOString(),
                by: `device ${step.device}`,
              };
              const entry = await recordEntry(
                checklist,
                LOG_ITEM,
                { attempts: [...(shown?.attempts ?? []), attempt] },
                `device ${step.device}`,
              );
              attempts.push(attempt.id);
              made.push({ opId: entry.opId, item: LOG_ITEM, value: null });
            } else {
              await syncOnce(network(device, step.fault));
            }
          }
          // The network heals: every device syncs until nothing is left, then pulls once more.
          for (let round = 0; round < 2; round++) {
            for (const device of devices) {
              forgetLocalDb(device.name);
              expect(await syncOnce(network(device, "none"))).toMatchObject({ ok: true });
            }
          }

          const ops = await knex("sync_ops").where({ checklist_id: checklist });
          const history = await knex("response_history").where({ checklist_id: checklist }).orderBy("id");
          const conflicts = await knex("sync_conflicts").where({ checklist_id: checklist });
          const current = await knex("checklist_responses").where({ checklist_id: checklist });

          // Each edit reached the server exactly once: its answer is kept in exactly one place.
          const answered = [
            ...history.map((h: any) => h.op_id),
            ...conflicts.map((c: any) => c.op_id),
            ...ops.map((o: any) => o.op_id),
          ];
          expect(answered.sort()).toEqual(made.map((m) => m.opId).sort());
          // No replay applied anything twice: one history row per applied operation, revisions 1..n per item.
          expect(new Set(history.map((h: any) => h.op_id)).size).toBe(history.length);
          for (const item of ITEMS) {
            const revs = history.filter((h: any) => h.item_key === item).map((h: any) => h.rev);
            expect(revs).toEqual(revs.map((_: number, i: number) => i + 1));
          }
          // Nothing lost: every edit is in the item's history or kept in a conflict row.
          for (const m of made) {
            if (m.item === LOG_ITEM) continue; // merged, not kept as sent: checked attempt by attempt below
            const inHistory = history.some(
              (h: any) => h.item_key === m.item && sameJson(parse(h.value), m.value),
            );
            const inConflict = conflicts.some(
              (c: any) => c.op_id === m.opId && sameJson(parse(c.client_value), m.value),
            );
            expect(inHistory || inConflict, `edit ${m.opId} on ${m.item} was lost`).toBe(true);
          }
          // Every attempt from every device is in the item, once, ordered by time taken then id.
          const log = current.find((r: any) => r.item_key === LOG_ITEM);
          const ids = log ? parse(log.value).attempts.map((a: any) => a.id) : [];
          expect([...ids].sort()).toEqual([...attempts].sort());
          // The server's value is the last applied one.
          for (const row of current) {
            const last = history.filter((h: any) => h.item_key === row.item_key).at(-1);
            expect(sameJson(parse(row.value), parse(last!.value))).toBe(true);
          }
          // Every device shows the server's state and has nothing waiting.
          for (const device of devices) {
            forgetLocalDb(device.name);
            const local = (await readChecklist(checklist))!;
            expect(local.waiting).toBe(0);
            for (const row of current) {
              expect(
                sameJson(local.responses[row.item_key]?.value, parse(row.value)),
                `${device.name} differs on ${row.item_key}`,
              ).toBe(true);
              expect(local.responses[row.item_key]?.rev).toBe(row.rev);
            }
          }
        }),
        LONG_SECONDS
          ? { numRuns: RUNS, interruptAfterTimeLimit: LONG_SECONDS * 1000, markInterruptAsFailure: false }
          : { numRuns: RUNS },
      );
      console.log(`sync model: ${histories} histories checked`);
    },
    (LONG_SECONDS || 240) * 1000 + 120_000,
  );
});
