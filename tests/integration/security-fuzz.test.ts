// Issue 14, section 5: malformed requests to every route of app/routes.ts, as anonymous and as each
// role, through the production server (`node server.js`): never a 5xx, and a refused request never
// changes the database. fast-check picks the route, the ids, the query string, the method, the
// headers and the body; a failure prints the shrunk request to replay.
import type { RouteConfigEntry } from "@react-router/dev/routes";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Role } from "~/lib/roles";
import { startChecklists } from "~/server/checklists.server";
import routes from "~/routes";
import { seedLibrary } from "../../db/seeds/library.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser, TEST_PASSWORD } from "../support/fixtures.ts";
import { startServer, type RunningServer } from "../support/server-process.ts";

/** How many requests the fuzz sends (each with a database fingerprint before and after). */
const RUNS = Number(process.env.FUZZ_RUNS ?? 1000);

type Who = Role | "anonymous";
const everyone: Who[] = ["anonymous", "technician", "lead", "manager", "surveyor"];
const knex = testDb();
let server: RunningServer;
const people: Partial<Record<Role, string>> = {};
const cookies: Partial<Record<Who, string>> = {};
const realIds: Record<string, string[]> = {};

async function signIn(email: string) {
  const response = await fetch(`${server.url}/login`, {
    method: "POST",
    headers: { Origin: server.url },
    body: new URLSearchParams({ email, password: TEST_PASSWORD }),
    redirect: "manual",
  });
  return response.headers.get("Set-Cookie")!.split(";")[0]!;
}

/** Every URL pattern of app/routes.ts that answers by itself, with its parameters. */
function patterns(entries: RouteConfigEntry[], parent = ""): string[] {
  return entries.flatMap((e) => {
    const path = e.path ? `${parent}/${e.path}` : parent;
    return e.children?.length ? patterns(e.children, path) : [path || "/"];
  });
}

// Tables whose rows a refused request may legitimately touch: failed sign-ins are counted, and
// reading a session can drop an expired one.
const BOOKKEEPING = new Set(["rate_limits", "sessions", "knex_migrations", "knex_migrations_lock"]);
let tables: string[] = [];
async function fingerprint(): Promise<string> {
  const [rows] = await knex.raw(`CHECKSUM TABLE ${tables.map((t) => `\`${t}\``).join(", ")}`);
  return (rows as { Checksum: number }[]).map((r) => r.Checksum).join(",");
}

beforeAll(async () => {
  server = await startServer();
  await seedLibrary(knex);
  for (const role of ["technician", "lead", "manager", "surveyor"] as Role[]) {
    people[role] = (await makeUser(knex, role)).email;
    cookies[role] = await signIn(people[role]!);
  }
  const [technician] = await knex("users").where({ email: people.technician }).select("id");
  const [lead] = await knex("users").where({ email: people.lead }).select("id");
  const job = await makeJob(knex, lead.id, [technician.id]);
  const [checklist] = await startChecklists(job.id, ["cooling"], lead.id);
  Object.assign(realIds, {
    jobId: [String(job.id)],
    vesselId: [String(job.vesselId)],
    checklistId: [checklist!],
    key: ["cooling", "exhaust"],
    version: ["1", "2"],
    name: ["propSlip", "shaftRunout"],
  });
  const [all] = await knex.raw("SHOW FULL TABLES WHERE Table_type = 'BASE TABLE'");
  tables = (all as Record<string, string>[])
    .map((r) => Object.values(r)[0]!)
    .filter((t) => !BOOKKEEPING.has(t));
}, 120_000);

afterAll(async () => {
  await server?.stop();
  await knex.destroy();
});

const nasty = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: "grapheme", maxLength: 20 }),
  fc.constantFrom(
    "0",
    "-1",
    "1e309",
    "99999999999999999999",
    "00000000-0000-4000-8000-000000000000",
    "%00",
    "..%2F..%2Fetc%2Fpasswd",
    "%E0%A4%A",
    "🚤",
    "x".repeat(2000),
    "null",
    "[]",
    "{}",
  ),
  fc.uuid(),
  fc.integer().map(String),
);

/** A URL for a pattern: each parameter a real id, or something malformed. */
const urlFor = (pattern: string) =>
  fc
    .record({
      params: fc.array(fc.oneof(nasty, fc.constant<string | null>(null)), { minLength: 5, maxLength: 5 }),
      query: fc.dictionary(fc.string({ maxLength: 12 }), fc.oneof(nasty, fc.constant("")), { maxKeys: 3 }),
    })
    .map(({ params, query }) => {
      let i = 0;
      const path = pattern.replace(/:(\w+)|\*/g, (_, name: string | undefined) => {
        const value = params[i++] ?? null;
        if (value === null) return (name && realIds[name]?.[0]) ?? "anything";
        return encodeURIComponent(value);
      });
      const search = new URLSearchParams(query).toString();
      return search ? `${path}?${search}` : path;
    });

const body = fc.oneof(
  fc.constant(undefined),
  fc.string({ maxLength: 200 }),
  fc.jsonValue({ maxDepth: 6 }).map((v) => JSON.stringify(v)),
  fc
    .dictionary(
      fc.constantFrom(
        "email",
        "password",
        "intent",
        "userId",
        "role",
        "name",
        "redirectTo",
        "text",
        "value",
        "ops",
      ),
      nasty,
      { maxKeys: 5 },
    )
    .map((fields) => new URLSearchParams(fields).toString()),
  fc.uint8Array({ maxLength: 300 }).map((bytes) => Buffer.from(bytes).toString("latin1")),
  fc.constant('--b\r\nContent-Disposition: form-data; name="x"\r\n\r\nunterminated'),
  // Deeply nested JSON, bare and as the value of a sync op (the probe's 2,000 levels were a 500).
  fc.integer({ min: 50, max: 2000 }).map((depth) => `${"[".repeat(depth)}${"]".repeat(depth)}`),
  fc
    .record({ depth: fc.integer({ min: 1, max: 2000 }), opId: fc.uuid() })
    .map(
      ({ depth, opId }) =>
        `{"deviceId":"fuzz-device-1","cursor":null,"ops":[{"opId":"${opId}","seq":1,"checklistId":"${
          realIds.checklistId![0]
        }","itemKey":"seacock","baseRev":0,"value":${"[".repeat(depth)}${"]".repeat(depth)}}]}`,
    ),
);

const contentType = fc.constantFrom(
  undefined,
  "application/x-www-form-urlencoded",
  "multipart/form-data; boundary=b",
  "multipart/form-data",
  "application/json",
  "text/plain",
  "image/jpeg",
  "application/octet-stream",
  "garbage/;;;=",
);

const fuzzedRequest = fc.constantFrom(...patterns(routes)).chain((pattern) =>
  fc.record({
    pattern: fc.constant(pattern),
    url: urlFor(pattern),
    who: fc.constantFrom(...everyone),
    method: fc.constantFrom("GET", "GET", "POST", "POST", "PUT", "DELETE", "PATCH"),
    contentType,
    body,
    origin: fc.constantFrom("same", "same", "same", "foreign", "none"),
    accept: fc.constantFrom(undefined, "application/json", "text/html", "*/*", "🚤/🚤"),
  }),
);

describe("fuzzing every route as every role", () => {
  it(
    `never answers 5xx and a refused request changes nothing (${RUNS} requests)`,
    { timeout: 180_000 },
    async () => {
      const statuses = new Map<number, number>();
      await fc.assert(
        fc.asyncProperty(fuzzedRequest, async (r) => {
          const headers: Record<string, string> = {};
          if (cookies[r.who]) headers.Cookie = cookies[r.who]!;
          if (r.contentType) headers["Content-Type"] = r.contentType;
          if (r.accept) headers.Accept = encodeURI(r.accept);
          if (r.origin !== "none") headers.Origin = r.origin === "same" ? server.url : "http://evil.example";
          const withBody = r.method !== "GET" && r.body !== undefined;
          const before = await fingerprint();
          const response = await fetch(`${server.url}${r.url}`, {
            method: r.method,
            headers,
            body: withBody ? r.body : undefined,
            redirect: "manual",
          });
          await response.arrayBuffer();
          statuses.set(response.status, (statuses.get(response.status) ?? 0) + 1);
          expect(response.status, `${r.method} ${r.url} as ${r.who}`).toBeLessThan(500);
          const refused = response.status >= 400 || /^\/login/.test(response.headers.get("Location") ?? "");
          if (refused)
            expect(await fingerprint(), `${r.method} ${r.url} as ${r.who} changed data`).toBe(before);
          // Signing out (a legitimate POST /logout) ends that role's session: sign in again.
          if (r.who !== "anonymous" && r.pattern === "/logout" && r.method !== "GET") {
            cookies[r.who] = await signIn(people[r.who]!);
          }
        }),
        { numRuns: RUNS, seed: process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined },
      );
      // Most requests must reach the routes, not just bounce off the perimeter.
      const reachedRoutes = [...statuses]
        .filter(([s]) => s !== 403 && s !== 415)
        .reduce((n, [, c]) => n + c, 0);
      expect(reachedRoutes).toBeGreaterThan(RUNS / 3);
    },
  );
});
