import type { RouteConfigEntry } from "@react-router/dev/routes";
import { matchRoutes, type RouteObject } from "react-router";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import routes from "~/routes";
import type { Role } from "~/lib/roles";
import { appHandler, signInCookie } from "../support/app.ts";
import { testDb } from "../support/db.ts";
import { makeJob, makeUser } from "../support/fixtures.ts";
import { seedLibrary } from "../../db/seeds/library.ts";
import { startChecklists } from "~/server/checklists.server";

type Who = Role | "anonymous";
const everyone: Who[] = ["anonymous", "technician", "lead", "manager", "surveyor"];
const knex = testDb();
afterAll(() => knex.destroy());

// What each person gets: 200, 302 (to sign in), 401 (API without session), 403, 404.
let app: Awaited<ReturnType<typeof appHandler>>;
const cookies: Partial<Record<Who, string>> = {};
let ownJob: number,
  otherJob: number,
  ownVessel: number,
  otherVessel: number,
  ownChecklist: string,
  otherChecklist: string;

beforeAll(async () => {
  app = await appHandler();
  const people: Partial<Record<Role, { id: number; email: string }>> = {};
  for (const role of ["technician", "lead", "manager", "surveyor"] as Role[]) {
    people[role] = await makeUser(knex, role);
    cookies[role] = await signInCookie(app, people[role]!.email);
  }
  const otherLead = await makeUser(knex, "lead");
  const own = await makeJob(knex, people.lead!.id, [people.technician!.id]);
  const other = await makeJob(knex, otherLead.id, []);
  [ownJob, otherJob, ownVessel, otherVessel] = [own.id, other.id, own.vesselId, other.vesselId];
  await seedLibrary(knex);
  [ownChecklist] = await startChecklists(ownJob, ["cooling"], people.lead!.id);
  [otherChecklist] = await startChecklists(otherJob, ["cooling"], otherLead.id);
});

const matrix: [string | (() => string), Record<Who, number>][] = [
  ["/", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 200 }],
  ["/login", { anonymous: 200, technician: 302, lead: 302, manager: 302, surveyor: 302 }],
  ["/jobs", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/jobs/new", { anonymous: 302, technician: 403, lead: 200, manager: 200, surveyor: 403 }],
  [() => `/jobs/${ownJob}`, { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  [() => `/jobs/${otherJob}`, { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 }],
  [() => `/jobs/${ownJob}/edit`, { anonymous: 302, technician: 403, lead: 200, manager: 200, surveyor: 403 }],
  [
    () => `/jobs/${otherJob}/edit`,
    { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 },
  ],
  ["/jobs/999999", { anonymous: 302, technician: 404, lead: 404, manager: 404, surveyor: 404 }],
  ["/vessels", { anonymous: 302, technician: 403, lead: 200, manager: 200, surveyor: 403 }],
  ["/vessels/new", { anonymous: 302, technician: 403, lead: 200, manager: 200, surveyor: 403 }],
  [
    () => `/vessels/${ownVessel}`,
    { anonymous: 302, technician: 403, lead: 200, manager: 200, surveyor: 403 },
  ],
  [
    () => `/vessels/${otherVessel}`,
    { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 },
  ],
  ["/people", { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 }],
  ["/account", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 200 }],
  [
    () => `/api/checklists/${ownChecklist}/replies`,
    { anonymous: 405, technician: 405, lead: 405, manager: 405, surveyor: 405 },
  ],
  ["/api/me", { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 200 }],
  ["/api/jobs", { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  [() => `/api/jobs/${ownJob}`, { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  [
    () => `/api/jobs/${otherJob}`,
    { anonymous: 401, technician: 403, lead: 403, manager: 200, surveyor: 403 },
  ],
  ["/api/jobs/not-a-number", { anonymous: 401, technician: 400, lead: 400, manager: 400, surveyor: 400 }],
  [
    () => `/checklists/${ownChecklist}`,
    { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 },
  ],
  [
    () => `/checklists/${otherChecklist}`,
    { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 },
  ],
  [
    "/checklists/00000000-0000-4000-8000-000000000000",
    { anonymous: 302, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  [
    () => `/api/checklists/${ownChecklist}`,
    { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 403 },
  ],
  [
    () => `/api/checklists/${otherChecklist}`,
    { anonymous: 401, technician: 403, lead: 403, manager: 200, surveyor: 403 },
  ],
  ["/api/templates/cooling/1", { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/api/templates/cooling/99", { anonymous: 401, technician: 404, lead: 404, manager: 404, surveyor: 403 }],
  [
    "/api/templates/cooling/zero",
    { anonymous: 401, technician: 400, lead: 400, manager: 400, surveyor: 403 },
  ],
  ["/healthz", { anonymous: 200, technician: 200, lead: 200, manager: 200, surveyor: 200 }],
  ["/no-such-page", { anonymous: 404, technician: 404, lead: 404, manager: 404, surveyor: 404 }],
  // The integration setup runs a local mail sink, so its development page exists, for managers only.
  ["/dev/mail", { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 }],
  ["/calculators", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/calculators/propSlip", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/library", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/audit", { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 }],
  ["/yard", { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 }],
  ["/sync", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 200 }],
  [
    () => `/checklists/${ownChecklist}/review`,
    { anonymous: 302, technician: 403, lead: 200, manager: 200, surveyor: 403 },
  ],
  [
    () => `/checklists/${otherChecklist}/review`,
    { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 },
  ],
  [
    "/records/00000000-0000-4000-8000-000000000000",
    { anonymous: 302, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  [
    "/records/00000000-0000-4000-8000-000000000000/photos/00000000-0000-4000-8000-000000000001",
    { anonymous: 302, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  [
    "/verify/00000000-0000-4000-8000-000000000000",
    { anonymous: 404, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  ["/api/offline", { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/api/sync", { anonymous: 405, technician: 405, lead: 405, manager: 405, surveyor: 405 }],
  // The routes the matrix used to miss (issue 14, section 5).
  ["/logout", { anonymous: 302, technician: 302, lead: 302, manager: 302, surveyor: 302 }],
  ["/invitation/not-a-token", { anonymous: 200, technician: 200, lead: 200, manager: 200, surveyor: 200 }],
  [
    "/records/00000000-0000-4000-8000-000000000000/pdf",
    { anonymous: 302, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  [
    "/records/00000000-0000-4000-8000-000000000000/json",
    { anonymous: 302, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  [
    "/api/photos/00000000-0000-4000-8000-000000000001",
    { anonymous: 401, technician: 404, lead: 404, manager: 404, surveyor: 404 },
  ],
  [
    "/api/templates/cooling/1/export",
    { anonymous: 401, technician: 200, lead: 200, manager: 200, surveyor: 403 },
  ],
  ["/library/import", { anonymous: 302, technician: 403, lead: 403, manager: 200, surveyor: 403 }],
  ["/library/cooling/compare", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  ["/library/cooling/1", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  // A published version is not edited in place: the manager is sent to its draft.
  ["/library/cooling/1/edit", { anonymous: 302, technician: 403, lead: 403, manager: 302, surveyor: 403 }],
];

const posts: [string | (() => string), Record<Who, number>][] = [
  ["/people", { anonymous: 302, technician: 403, lead: 403, manager: 400, surveyor: 403 }],
  // An empty form is every message turned off: a choice, not an error.
  ["/account", { anonymous: 302, technician: 200, lead: 200, manager: 200, surveyor: 403 }],
  [
    () => `/api/checklists/${ownChecklist}/replies`,
    // The surveyor is refused on role before the empty form is read.
    { anonymous: 401, technician: 400, lead: 400, manager: 400, surveyor: 403 },
  ],
  ["/yard", { anonymous: 302, technician: 403, lead: 403, manager: 400, surveyor: 403 }],
  ["/jobs/new", { anonymous: 302, technician: 403, lead: 400, manager: 400, surveyor: 403 }],
  ["/vessels/new", { anonymous: 302, technician: 403, lead: 400, manager: 400, surveyor: 403 }],
  [
    () => `/jobs/${otherJob}/edit`,
    { anonymous: 302, technician: 403, lead: 403, manager: 400, surveyor: 403 },
  ],
  [() => `/jobs/${ownJob}`, { anonymous: 302, technician: 403, lead: 400, manager: 400, surveyor: 403 }],
  [() => `/jobs/${otherJob}`, { anonymous: 302, technician: 403, lead: 403, manager: 400, surveyor: 403 }],
  [
    () => `/checklists/${ownChecklist}/review`,
    { anonymous: 302, technician: 403, lead: 400, manager: 400, surveyor: 403 },
  ],
];

/** The route module a URL reaches, matched against app/routes.ts as React Router matches it. */
function routeFileOf(url: string): string | undefined {
  const toObjects = (entries: RouteConfigEntry[]): RouteObject[] =>
    entries.map((e) =>
      e.index
        ? { id: e.file, index: true, path: e.path }
        : { id: e.file, path: e.path, children: e.children ? toObjects(e.children) : undefined },
    );
  return matchRoutes(toObjects(routes), new URL(url, "http://localhost").pathname)?.at(-1)?.route.id;
}

/** Every route module of app/routes.ts that answers a URL itself (layouts only wrap others). */
function leafRouteFiles(entries: RouteConfigEntry[]): string[] {
  return entries.flatMap((e) => (e.children?.length ? leafRouteFiles(e.children) : [e.file]));
}

describe("role matrix: every page and API route for every role", () => {
  it("has a row for every route of app/routes.ts", () => {
    const urls = [...matrix, ...posts].map(([path]) => (typeof path === "string" ? path : path()));
    const covered = new Set(urls.map(routeFileOf));
    const missing = leafRouteFiles(routes).filter((file) => !covered.has(file));
    expect(missing, "routes with no row in the role matrix").toEqual([]);
  });

  for (const [path, expected] of matrix) {
    for (const who of everyone) {
      it(`${typeof path === "string" ? path : path.toString().replace(/^\(\) => /, "")} as ${who} → ${expected[who]}`, async () => {
        const url = typeof path === "string" ? path : path();
        const response = await app(url, { cookie: cookies[who] });
        expect(response.status).toBe(expected[who]);
        if (expected[who] === 302 && who === "anonymous")
          expect(response.headers.get("Location")).toMatch(/^\/(login|$)/);
      });
    }
  }

  for (const [path, expected] of posts) {
    for (const who of everyone) {
      it(`POST ${typeof path === "string" ? path : path.toString().replace(/^\(\) => /, "")} with an empty form as ${who} → ${expected[who]}`, async () => {
        const url = typeof path === "string" ? path : path();
        const response = await app(url, {
          method: "POST",
          body: new URLSearchParams({}),
          cookie: cookies[who],
        });
        expect(response.status).toBe(expected[who]);
      });
    }
  }
});
