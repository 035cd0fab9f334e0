import { afterAll, beforeAll, describe, expect, it } from "vitest";
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
];

describe("role matrix: every page and API route for every role", () => {
  for (const [path, expected] of matrix) {
    for (const who of everyone) {
      it(`${typeof path === "string" ? path : path.toString().replace(/^\(\) => /, "")} as ${who} → ${expected[who]}`, async () => {
        const url = typeof path === "string" ? path : path();
        const response = await app(url, { cookie: cookies[who] });
        expect(response.status).toBe(expected[who]);
        if (expected[who] === 302 && who === "anonymous")
          expect(response.headers.get("Location")).toMatch(/^\/login/);
      });
    }
  }

  const posts: [string | (() => string), Record<Who, number>][] = [
    ["/people", { anonymous: 302, technician: 403, lead: 403, manager: 400, surveyor: 403 }],
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
