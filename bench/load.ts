// Load on the production build over loopback (issue 14, section 4): 32 concurrent signed-in
// clients, each route in turn for a fixed time — /healthz, GET /api/jobs, a full sync pull and a
// 10-operation sync push — then requests per second, latency percentiles, errors, each route's
// p99 as a multiple of the health route's, and the server's peak resident memory.
//   npx react-router build && npx tsx bench/load.ts     (SECONDS=10 CONNECTIONS=32 to change)
//   ONLY="sync push"   the health route and that one only
//   SERVER_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/prof"   flags for the server's node
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import autocannon from "autocannon";
import { connect, createDatabase, dropDatabase } from "../db/connect.ts";
import { seedLibrary } from "../db/seeds/library.ts";
import { makeJob, makeUser, TEST_PASSWORD } from "../tests/support/fixtures.ts";
import { check } from "../tests/support/sync.ts";
import { startServer } from "../tests/support/server-process.ts";

const SECONDS = Number(process.env.SECONDS ?? 10);
const CONNECTIONS = Number(process.env.CONNECTIONS ?? 32);
// The 10 check items of the cooling checklist a push writes (cooling.v1.json).
const ITEMS = [
  "seacock",
  "intake-hose",
  "strainer",
  "impeller",
  "heat-exchanger",
  "coolant-type",
  "coolant-bled",
  "thermostat",
  "cooling-hoses",
  "no-cooling-leaks",
];

const base = new URL(process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost");
base.pathname = `/sternpost_bench_load${process.env.TEST_DB_SUFFIX ?? ""}`;
const url = base.toString();
await dropDatabase(url);
await createDatabase(url);
const knex = connect(url);
await knex.migrate.latest();
await seedLibrary(knex);
process.env.DATABASE_URL = url;
const { startChecklists } = await import("../app/server/checklists.server.ts");

// One technician with a job of 6 checklists per client, so pushes go to their own items.
const lead = await makeUser(knex, "lead");
const clients: { cookie: string; checklistId: string; email: string; cursor: string | null }[] = [];
const technicians = await Promise.all(
  Array.from({ length: CONNECTIONS }, () => makeUser(knex, "technician")),
);
for (const technician of technicians) {
  const job = await makeJob(knex, lead.id, [technician.id]);
  const ids = await startChecklists(
    job.id,
    ["cooling", "exhaust", "engine-alignment", "sea-trial", "instruments-and-electrical"],
    lead.id,
  );
  clients.push({ cookie: "", checklistId: ids[0]!, email: technician.email, cursor: null });
}

const server = await startServer({
  DATABASE_URL: url,
  LOG_LEVEL: "info",
  SESSION_SECRET: process.env.SESSION_SECRET ?? "load-bench-secret-0123456789abcdef",
});
for (const client of clients) {
  const response = await fetch(`${server.url}/login`, {
    method: "POST",
    headers: { Origin: server.url },
    body: new URLSearchParams({ email: client.email, password: TEST_PASSWORD }),
    redirect: "manual",
  });
  client.cookie = response.headers.get("Set-Cookie")!.split(";")[0]!;
}

/**
 * Every push carries 10 fresh operations and, as a tablet's does, the cursor its last answer gave
 * (so it pulls only what changed since); each client writes its own checklist, round after round.
 */
const revs = new Map<string, number>();
function pushBody(client: (typeof clients)[number]) {
  const ops = ITEMS.map((itemKey, i) => {
    const key = `${client.checklistId}/${itemKey}`;
    const baseRev = revs.get(key) ?? 0;
    revs.set(key, baseRev + 1);
    return {
      opId: randomUUID(),
      seq: i + 1,
      checklistId: client.checklistId,
      itemKey,
      value: check(baseRev % 2 ? "pass" : "fail"),
      baseRev,
      at: new Date().toISOString(),
    };
  });
  return JSON.stringify({ deviceId: `bench-${client.email}`, cursor: client.cursor, ops });
}

interface Scenario {
  name: string;
  method: "GET" | "POST";
  path: string;
  body?: (client: (typeof clients)[number]) => string;
}
const scenarios: Scenario[] = [
  { name: "health", method: "GET", path: "/healthz" },
  { name: "jobs", method: "GET", path: "/api/jobs" },
  {
    name: "sync pull",
    method: "POST",
    path: "/api/sync",
    body: (c) => JSON.stringify({ deviceId: `bench-pull-${c.email}`, cursor: null, ops: [] }),
  },
  { name: "sync push", method: "POST", path: "/api/sync", body: pushBody },
];

let peakSampled = 0;
const sampler = setInterval(() => {
  peakSampled = Math.max(peakSampled, server.memoryMb().rss);
}, 100);

const results: {
  name: string;
  rps: number;
  p50: number;
  p975: number;
  p99: number;
  errors: number;
  cpuMs: number;
}[] = [];
for (const scenario of scenarios.filter(
  (s) => !process.env.ONLY || ["health", process.env.ONLY].includes(s.name),
)) {
  let next = 0;
  const cpuBefore = server.cpuMs();
  const result = await autocannon({
    url: server.url,
    connections: CONNECTIONS,
    duration: SECONDS,
    requests: [
      {
        method: scenario.method,
        path: scenario.path,
        setupRequest: (request, context) => {
          // Each connection is one client, so a client's requests follow one another.
          const client = (context.client ??= clients[next++ % clients.length]!);
          const headers: Record<string, string> = { Cookie: client.cookie, Origin: server.url };
          if (scenario.body) headers["Content-Type"] = "application/json";
          return { ...request, headers, body: scenario.body?.(client) };
        },
        onResponse: (status, body, context) => {
          if (status === 200 && scenario.name === "sync push")
            context.client!.cursor = (JSON.parse(body) as { cursor: string }).cursor;
        },
      },
    ],
  });
  results.push({
    name: scenario.name,
    rps: result.requests.average,
    p50: result.latency.p50,
    p975: result.latency.p97_5,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts + result.non2xx,
    // The server's own CPU per answer: what a route costs, whatever else the machine is doing.
    cpuMs: (server.cpuMs() - cpuBefore) / Math.max(result.requests.total, 1),
  });
}
clearInterval(sampler);
const peak = Math.max(peakSampled, server.memoryMb().peak);
// What the failed requests were answered, from the server's own request log.
const failed = new Map<string, number>();
for (const line of server.logLines()) {
  const { req, res, msg } = line as { req?: { route: string }; res?: { status: number }; msg?: string };
  if (req && res && res.status >= 400) {
    const key = `${res.status} ${req.route}`;
    failed.set(key, (failed.get(key) ?? 0) + 1);
  } else if (msg && msg !== "request" && !/listening/.test(msg)) failed.set(msg, (failed.get(msg) ?? 0) + 1);
}
await server.stop();
await knex.destroy();

const health = results[0]!;
console.log(
  `\n${CONNECTIONS} connections, ${SECONDS} s per route, production build on loopback (${readFileSync("/proc/cpuinfo", "utf8").match(/^processor/gm)?.length ?? "?"} CPUs)\n`,
);
console.log("route       req/s   p50 ms  p97.5 ms  p99 ms  errors  p99 / health p99  server CPU ms/req");
for (const r of results) {
  console.log(
    `${r.name.padEnd(10)} ${r.rps.toFixed(0).padStart(6)} ${r.p50.toFixed(0).padStart(8)} ${r.p975
      .toFixed(0)
      .padStart(9)} ${r.p99.toFixed(0).padStart(7)} ${String(r.errors).padStart(7)}  ${(
      r.p99 / Math.max(health.p99, 1)
    )
      .toFixed(2)
      .padStart(16)}  ${r.cpuMs.toFixed(2).padStart(17)}`,
  );
}
console.log(`\nserver peak RSS: ${peak.toFixed(0)} MB (target < 250 MB)`);
const push = results.find((r) => r.name === "sync push")!;
console.log(
  `sync push p99 / health p99: ${(push.p99 / Math.max(health.p99, 1)).toFixed(2)} (target ≤ 3); errors: ${results.reduce((n, r) => n + r.errors, 0)} (target 0)`,
);
if (failed.size) console.log("server answers other than 2xx and log messages:", Object.fromEntries(failed));
