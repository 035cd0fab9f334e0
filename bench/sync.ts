// Server time to apply a 1,000-operation sync batch, against a raw Knex batch insert of the same
// 1,000 rows into the same MariaDB, in one run. Prints both medians and their ratio, and the
// floor: the row an applied operation must write (its history row, whose latest per item is the
// current value, decision 046), inserted raw into the real table. Then a tablet's everyday push:
// 10 operations on one checklist, many in a row, beside a raw insert of the same 10 rows, with the
// app's own CPU time per push.
//   npx tsx bench/sync.ts        (MariaDB from DATABASE_URL, default the private one on :3307)
//   PROFILE=1 npx tsx bench/sync.ts   also lists every statement of the last timed batch, timed
//   ROUNDS=n                           timed rounds (default 9)
//   SMALL_PUSHES=n                     pushes of 10 operations in a row (default 300)
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { performance } from "node:perf_hooks";
import { connect, createDatabase, dropDatabase } from "../db/connect.ts";
import { seedLibrary } from "../db/seeds/library.ts";

const base = new URL(process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost");
base.pathname = `/sternpost_bench_sync${process.env.TEST_DB_SUFFIX ?? ""}`;
const url = base.toString();
process.env.DATABASE_URL = url;

const OPS = 1000;
const ROUNDS = Number(process.env.ROUNDS ?? 9);

await dropDatabase(url);
await createDatabase(url);
const knex = connect(url);
await knex.migrate.latest();
await seedLibrary(knex);
const { sync } = await import("../app/server/sync.server.ts");
const { startChecklists } = await import("../app/server/checklists.server.ts");
const { findItem } = await import("../app/lib/templates/index.ts");

const [lead] = await knex("users").insert({
  email: "lead@bench.example",
  name: "Bench lead",
  role: "lead",
  password_hash: "x",
});
const [tech] = await knex("users").insert({
  email: "tech@bench.example",
  name: "Bench tech",
  role: "technician",
  password_hash: "x",
});
const [vessel] = await knex("vessels").insert({
  name: "Bench hull",
  length_value: 30,
  length_unit: "ft",
  length_m: 9.144,
  hull_type: "planing",
  owner_name: "Bench",
});

/** Enough checklists that one batch of OPS operations touches OPS different check items. */
async function freshItems(count: number) {
  const items: { checklistId: string; itemKey: string }[] = [];
  while (items.length < count) {
    const [job] = await knex("jobs").insert({
      vessel_id: vessel,
      scope: "repower",
      status: "underway",
      engine_model: "Bench",
      engine_serial: randomUUID().slice(0, 8),
      rated_power_hp: 200,
      rated_rpm_min: 2600,
      rated_rpm_max: 2800,
      gear_ratio: 2,
      prop_diameter_in: 20,
      prop_pitch_in: 18,
      prop_blades: 3,
      shaft_diameter_in: 1.25,
      shaft_material: "316",
      coupling_type: "Split",
      lead_id: lead,
    });
    await knex("job_technicians").insert({ job_id: job, user_id: tech });
    const ids = await startChecklists(
      job,
      [
        "propeller-shaft-and-coupling",
        "engine-alignment",
        "exhaust",
        "cooling",
        "instruments-and-electrical",
        "sea-trial",
      ],
      lead,
    );
    for (const id of ids) {
      const row = await knex("job_checklists as c")
        .join("template_versions as t", "t.id", "c.template_version_id")
        .where("c.id", id)
        .first("t.body");
      const template = JSON.parse(row.body);
      for (const section of template.sections)
        for (const item of section.items)
          if (findItem(template, item.key)?.kind === "check")
            items.push({ checklistId: id, itemKey: item.key });
    }
  }
  return items.slice(0, count);
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const actor = { id: tech as number, name: "Bench tech", role: "technician" as const };
// The raw baseline: a plain table shaped like an item's current value (the value table of the
// earlier rounds, unchanged so the ratios compare), with its keys but no foreign keys or triggers.
await knex.raw(`CREATE TABLE bench_raw (
  checklist_id char(36) NOT NULL, item_key varchar(80) NOT NULL,
  value longtext CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL CHECK (json_valid(value)),
  rev int unsigned NOT NULL, updated_by int unsigned NOT NULL, device_id varchar(64) DEFAULT NULL,
  updated_at datetime(3) NOT NULL, change_seq bigint unsigned NOT NULL, open_ref char(36) DEFAULT NULL,
  PRIMARY KEY (checklist_id, item_key), KEY (updated_by), KEY (change_seq), KEY (open_ref)
) DEFAULT CHARSET=utf8mb4`);

/** Runs `work` timing it and each SQL statement it sends (the round trips of one batch). */
async function statementsOf<T>(work: () => Promise<T>) {
  const { applierDb, db } = await import("../app/server/db.server.ts");
  const list: { sql: string; ms: number }[] = [];
  const started = new Map<string, number>();
  type Query = { __knexQueryUid: string; sql: string };
  const onQuery = (q: Query) => started.set(q.__knexQueryUid, performance.now());
  const onResponse = (_r: unknown, q: Query) =>
    list.push({
      sql: q.sql.replace(/\s+/g, " ").slice(0, 110),
      ms: performance.now() - started.get(q.__knexQueryUid)!,
    });
  for (const pool of [db(), applierDb()]) pool.on("query", onQuery).on("query-response", onResponse);
  const t = performance.now();
  try {
    const result = await work();
    return { result, ms: performance.now() - t, list };
  } finally {
    for (const pool of [db(), applierDb()]) pool.off("query", onQuery).off("query-response", onResponse);
  }
}

const statementCounts: number[] = [];
const syncTimes: number[] = [];
const rawTimes: number[] = [];
const floorTimes: number[] = [];
for (let round = 0; round < ROUNDS + 1; round++) {
  const items = await freshItems(OPS);
  const at = new Date().toISOString();
  const ops = items.map((it, seq) => ({
    opId: randomUUID(),
    seq,
    checklistId: it.checklistId,
    itemKey: it.itemKey,
    value: { result: "pass" as const },
    baseRev: 0,
    at,
  }));
  // The device is caught up first (pulled until no page is left), so the timed call applies the
  // batch and pulls only what it wrote, not a backlog of earlier rounds.
  let cursor: string | null = null;
  for (let more = true; more;) {
    const page = await sync(actor, { deviceId: "bench-device", cursor, ops: [] });
    ({ cursor } = page);
    more = page.more === true;
  }
  const statements = await statementsOf(() => sync(actor, { deviceId: "bench-device", cursor, ops }));
  const { result: answer, ms: syncMs } = statements;
  statementCounts.push(statements.list.length);
  if (process.env.PROFILE && round === ROUNDS) {
    console.log(`the sync call, statement by statement (ms):`);
    for (const x of statements.list) console.log(x.ms.toFixed(1).padStart(7), x.sql);
    console.log(
      `${(syncMs - statements.list.reduce((a, x) => a + x.ms, 0)).toFixed(1).padStart(7)} outside statements (JS, commit)`,
    );
  }
  if (answer.results.some((r) => r.status !== "applied"))
    throw new Error("the benchmark batch was not applied");

  const rows = items.map((it) => ({
    checklist_id: it.checklistId,
    item_key: it.itemKey,
    value: JSON.stringify({ result: "pass" }),
    rev: 1,
    updated_by: tech,
    device_id: "bench-device",
    updated_at: new Date(),
    change_seq: 1,
  }));
  let t = performance.now();
  await knex.transaction(async (trx) => {
    await trx("bench_raw").insert(rows);
  });
  const rawMs = performance.now() - t;
  await knex("bench_raw").delete();

  // The floor under any sync that keeps the rules: the row each applied operation must write
  // (its history row, with its change number), inserted raw into the real table — with its
  // foreign keys and the trigger that keeps countersigned checklists sealed.
  const floorItems = await freshItems(OPS);
  const now = new Date();
  const history = floorItems.map((it) => ({
    checklist_id: it.checklistId,
    item_key: it.itemKey,
    rev: 1,
    value: JSON.stringify({ result: "pass" }),
    user_id: tech,
    device_id: "bench-device",
    op_id: randomUUID(),
    at: now,
    client_at: at,
    change_seq: 1,
  }));
  t = performance.now();
  await knex.transaction(async (trx) => {
    await trx("response_history").insert(history);
  });
  const floorMs = performance.now() - t;
  if (round > 0) {
    syncTimes.push(syncMs);
    rawTimes.push(rawMs);
    floorTimes.push(floorMs);
  } // round 0 warms up pools and caches
}

const s = median(syncTimes);
const r = median(rawTimes);
console.log(
  `sync batch of ${OPS} operations: ${s.toFixed(1)} ms (median of ${ROUNDS}), ${median(statementCounts)} round trips to MariaDB`,
);
console.log(`raw Knex insert of ${OPS} rows:  ${r.toFixed(1)} ms (median of ${ROUNDS})`);
const f = median(floorTimes);
console.log(`ratio sync / raw insert: ${(s / r).toFixed(2)}× (target ≤ 3×)`);
console.log(
  `floor (the history row, raw, real table with its trigger and keys): ${f.toFixed(1)} ms = ${(f / r).toFixed(2)}× raw; sync / floor ${(s / f).toFixed(2)}×`,
);
if (f / r > 3)
  console.log(
    `≤ 3× raw is below the floor here: the history row every applied entry must write, with its keys and the seal trigger, alone takes ${(f / r).toFixed(2)}× (docs/decisions/042-sync-cost-floor.md)`,
  );

// A tablet's everyday push: 10 operations on the items of one checklist, one push after another,
// each on the current revision, so the checklist's history grows as on a long job (SMALL_PUSHES
// of them, 300 by default). Beside it, the same 10 rows inserted raw in a transaction of their own.
const SMALL_PUSHES = Number(process.env.SMALL_PUSHES ?? 300);
const candidates = await freshItems(100);
const checkItemsOf = (id: string) => candidates.filter((it) => it.checklistId === id);
const fullest = [...new Set(candidates.map((it) => it.checklistId))].sort(
  (a, b) => checkItemsOf(b).length - checkItemsOf(a).length,
)[0]!;
const own = checkItemsOf(fullest).slice(0, 10);
/**
 * MariaDB's own CPU time so far, when it is the private server `npm start` runs (its pid file is in
 * .data): /proc counts in ticks of 10 ms (USER_HZ), so only a sum over many pushes means much.
 */
const mariadbCpuMs = (() => {
  let pid: string;
  try {
    pid = readFileSync(".data/mariadb/mariadb.pid", "utf8").trim();
    readFileSync(`/proc/${pid}/stat`);
  } catch {
    return null;
  }
  return () => {
    const fields = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]!.split(" ");
    return (Number(fields[11]) + Number(fields[12])) * 10; // utime + stime
  };
})();
let mariadbMs = 0;
let mariadbRawMs = 0;
const pushTimes: number[] = [];
const pushCpu: number[] = [];
const smallRawTimes: number[] = [];
let tabletCursor: string | null = null;
for (let round = 0; round < SMALL_PUSHES; round++) {
  const ops = own.map((it, seq) => ({
    opId: randomUUID(),
    seq,
    checklistId: it.checklistId,
    itemKey: it.itemKey,
    value: { result: round % 2 ? ("pass" as const) : ("fail" as const) },
    baseRev: round,
    at: new Date().toISOString(),
  }));
  let t = performance.now();
  const cpu = process.cpuUsage();
  const mariadbBefore = mariadbCpuMs?.() ?? 0;
  const answer = await sync(actor, { deviceId: "bench-tablet", cursor: tabletCursor, ops });
  mariadbMs += (mariadbCpuMs?.() ?? 0) - mariadbBefore;
  pushTimes.push(performance.now() - t);
  // This process's own CPU while it applied the push (nothing else runs here meanwhile).
  const used = process.cpuUsage(cpu);
  pushCpu.push((used.user + used.system) / 1000);
  tabletCursor = answer.cursor;
  if (answer.results.some((r) => r.status !== "applied")) throw new Error("a benchmark push was not applied");
  const rows = own.map((it) => ({
    checklist_id: it.checklistId,
    item_key: `${it.itemKey}-${round}`,
    value: JSON.stringify({ result: "pass" }),
    rev: round + 1,
    updated_by: tech,
    device_id: "bench-tablet",
    updated_at: new Date(),
    change_seq: round + 1,
  }));
  t = performance.now();
  const mariadbBeforeRaw = mariadbCpuMs?.() ?? 0;
  await knex.transaction(async (trx) => {
    await trx("bench_raw").insert(rows);
  });
  mariadbRawMs += (mariadbCpuMs?.() ?? 0) - mariadbBeforeRaw;
  smallRawTimes.push(performance.now() - t);
}
const p = median(pushTimes.slice(1));
const pr = median(smallRawTimes.slice(1));
console.log(
  `\n${own.length}-operation push, ${SMALL_PUSHES} in a row on one checklist: ${p.toFixed(2)} ms (median); raw insert of ${own.length} rows: ${pr.toFixed(2)} ms; ratio ${(p / pr).toFixed(2)}×`,
);
console.log(`the app's CPU per push: ${median(pushCpu.slice(1)).toFixed(2)} ms (median)`);
if (mariadbCpuMs)
  console.log(
    `MariaDB's CPU per push: ${(mariadbMs / SMALL_PUSHES).toFixed(2)} ms; per raw insert of the same rows: ${(mariadbRawMs / SMALL_PUSHES).toFixed(2)} ms (its process, over all of them)`,
  );

await knex.destroy();
const { applierDb, db } = await import("../app/server/db.server.ts");
await Promise.all([db().destroy(), applierDb().destroy()]);
await dropDatabase(url);
