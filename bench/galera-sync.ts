// Devices syncing concurrently through two app instances on two Galera nodes (scripts/galera.sh
// starts them). Afterwards every sync guarantee must hold: no 5xx (certification conflicts
// between the nodes are retried by the server, never shown), every operation answered, each
// applied operation written exactly once, every conflicting value kept, both nodes identical,
// and every device's copy equal to the server's.
// Usage: tsx bench/galera-sync.ts <app on node 1> <app on node 2> <node 1 DATABASE_URL> <node 2 DATABASE_URL>
import { randomUUID } from "node:crypto";
import { connect } from "../db/connect.ts";
import { DEMO_PASSWORD } from "../db/seeds/demo-people.ts";

const [appA, appB, urlA, urlB] = process.argv.slice(2) as [string, string, string, string];
const DEVICES = Number(process.env.DEVICES ?? 6);
const ROUNDS = Number(process.env.ROUNDS ?? 40);
const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);

async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/login`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: base },
    body: new URLSearchParams({ email, password: DEMO_PASSWORD }),
  });
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  if (res.status >= 400 || !cookie) throw new Error(`sign-in at ${base} answered ${res.status}`);
  return cookie;
}

interface Answer {
  opId: string;
  status: string;
  rev?: number;
  code?: string;
  conflictId?: number;
}
interface Change {
  checklistId: string;
  itemKey: string;
  value: unknown;
  rev: number;
}

const statuses = new Map<number, number>();
async function push(base: string, cookie: string, body: unknown) {
  for (let attempt = 0; ; attempt++) {
    const res = await fetch(`${base}/api/sync`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: base, Cookie: cookie },
      body: JSON.stringify(body),
    });
    statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
    if (res.ok)
      return (await res.json()) as { results: Answer[]; changes: Change[]; cursor: string; more?: boolean };
    if (res.status < 500 || attempt > 5) throw new Error(`sync answered ${res.status}: ${await res.text()}`);
    await new Promise((r) => setTimeout(r, 50 * 2 ** attempt));
  }
}

const knexA = connect(urlA);
const knexB = connect(urlB);
try {
  // The demo technician's first open checklist and its check items.
  const tech = await knexA("users").where({ email: "tech@kittiwake-slip.example" }).first();
  const target = await knexA("job_checklists as c")
    .join("job_technicians as t", "t.job_id", "c.job_id")
    .join("template_versions as v", "v.id", "c.template_version_id")
    .where({ "t.user_id": tech!.id })
    .whereIn("c.state", ["in-progress", "returned"])
    .first("c.id", "v.body");
  const items: string[] = [];
  for (const section of parse(target.body).sections)
    for (const item of section.items) if (item.kind === "check") items.push(item.key);
  const hot = items.slice(0, 3); // a few items, so devices collide on purpose

  // A session made through one instance is good on the other (sessions live in the database).
  const cookie = await signIn(appA, "tech@kittiwake-slip.example");
  const devices = Array.from({ length: DEVICES }, (_, i) => ({
    id: `galera-device-${i}-${randomUUID().slice(0, 8)}`,
    seq: 0,
    cursor: null as string | null,
    revs: new Map<string, number>(),
    values: new Map<string, unknown>(),
    sent: [] as { opId: string; itemKey: string; value: unknown }[],
    answers: new Map<string, Answer>(),
  }));

  const absorb = (d: (typeof devices)[number], changes: Change[]) => {
    for (const c of changes) {
      if (c.checklistId !== target.id) continue;
      if ((d.revs.get(c.itemKey) ?? 0) > c.rev) continue; // never lower a known revision
      d.revs.set(c.itemKey, c.rev);
      d.values.set(c.itemKey, c.value);
    }
  };
  const pull = async (d: (typeof devices)[number], base: string) => {
    for (let page = 0; page < 1000; page++) {
      const answer = await push(base, cookie, { deviceId: d.id, cursor: d.cursor, ops: [] });
      absorb(d, answer.changes);
      d.cursor = answer.cursor;
      if (!answer.more) return;
    }
  };

  const started = Date.now();
  for (let round = 0; round < ROUNDS; round++) {
    await Promise.all(
      devices.map(async (d, i) => {
        const base = (round + i) % 2 ? appB : appA;
        // Two items per request, so multi-row writes (and their ids) cross the nodes too.
        const ops = [0, 1].map((k) => {
          const itemKey = hot[(round * 7 + i + k) % hot.length]!;
          const value =
            (round + i + k) % 3 === 0
              ? { result: "pass" }
              : { result: "fail", note: `Round ${round}, device ${i}: weeping at the flange` };
          return {
            opId: randomUUID(),
            seq: ++d.seq,
            checklistId: target.id,
            itemKey,
            value,
            baseRev: d.revs.get(itemKey) ?? 0,
            at: new Date().toISOString(),
          };
        });
        for (const op of ops) d.sent.push({ opId: op.opId, itemKey: op.itemKey, value: op.value });
        const answer = await push(base, cookie, { deviceId: d.id, cursor: d.cursor, ops });
        for (const [k, r] of answer.results.entries()) {
          d.answers.set(r.opId, r);
          const { itemKey, value } = ops[k]!;
          if (r.status === "applied" && r.rev !== undefined && r.rev > (d.revs.get(itemKey) ?? 0)) {
            d.revs.set(itemKey, r.rev);
            d.values.set(itemKey, value);
          }
        }
        absorb(d, answer.changes);
        d.cursor = answer.cursor;
      }),
    );
  }
  const seconds = (Date.now() - started) / 1000;
  for (const [i, d] of devices.entries()) await pull(d, i % 2 ? appB : appA);

  // The guarantees.
  const problems: string[] = [];
  const sent = devices.flatMap((d) => d.sent.map((s) => ({ ...s, answer: d.answers.get(s.opId) })));
  const unanswered = sent.filter((s) => !s.answer);
  if (unanswered.length) problems.push(`${unanswered.length} operations never answered`);
  const applied = sent.filter((s) => s.answer?.status === "applied").map((s) => s.opId);
  const conflicted = sent.filter((s) => s.answer?.status === "conflict").map((s) => s.opId);
  for (const [name, knex] of [
    ["node 1", knexA],
    ["node 2", knexB],
  ] as const) {
    // An applied operation is a revision in the history, or (same value as the server's) a bookkeeping row.
    const history = await knex("response_history").whereIn("op_id", applied).count({ n: "*" }).first();
    const same = await knex("sync_ops").whereIn("op_id", applied).count({ n: "*" }).first();
    if (Number(history!.n) + Number(same!.n) !== applied.length)
      problems.push(
        `${name}: ${history!.n} history and ${same!.n} bookkeeping rows for ${applied.length} applied operations`,
      );
    const kept = await knex("sync_conflicts").whereIn("op_id", conflicted).count({ n: "*" }).first();
    if (Number(kept!.n) !== conflicted.length)
      problems.push(`${name}: ${kept!.n} conflicts kept for ${conflicted.length} conflicting operations`);
  }
  // Each conflict answer names the row that keeps that operation's value.
  for (const s of sent.filter((x) => x.answer?.status === "conflict")) {
    const row = await knexB("sync_conflicts")
      .where({ id: s.answer!.conflictId ?? 0 })
      .first("op_id");
    if (row?.op_id !== s.opId)
      problems.push(`conflict ${s.answer!.conflictId} is not the one kept for ${s.opId}`);
  }
  const rows = async (knex: typeof knexA) =>
    (await knex("checklist_responses").where({ checklist_id: target.id }).orderBy("item_key"))
      .map((r) => `${r.item_key}@${r.rev}=${JSON.stringify(parse(r.value))}`)
      .join("\n");
  const [onA, onB] = [await rows(knexA), await rows(knexB)];
  if (onA !== onB) problems.push("the two nodes hold different responses");
  const server = new Map(
    (await knexB("checklist_responses").where({ checklist_id: target.id })).map((r) => [
      r.item_key,
      { rev: r.rev, value: JSON.stringify(parse(r.value)) },
    ]),
  );
  for (const [i, d] of devices.entries())
    for (const key of hot) {
      const s = server.get(key);
      if (!s) continue;
      if (d.revs.get(key) !== s.rev || JSON.stringify(d.values.get(key)) !== s.value)
        problems.push(`device ${i} holds ${key}@${d.revs.get(key)}, the server ${key}@${s.rev}`);
    }
  const fiveHundreds = [...statuses].filter(([s]) => s >= 500).reduce((n, [, c]) => n + c, 0);
  if (fiveHundreds) problems.push(`${fiveHundreds} answers were 5xx`);

  console.log(
    `[galera] ${sent.length} operations from ${DEVICES} devices through 2 instances on 2 nodes in ${seconds.toFixed(1)} s: ` +
      `${applied.length} applied, ${conflicted.length} conflicts kept, ` +
      `answers by status ${JSON.stringify(Object.fromEntries(statuses))}`,
  );
  if (problems.length) {
    console.error(`[galera] FAILED:\n  ${problems.join("\n  ")}`);
    process.exitCode = 1;
  } else console.log("[galera] every guarantee held");
} finally {
  await knexA.destroy();
  await knexB.destroy();
}
