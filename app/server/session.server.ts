import { randomBytes } from "node:crypto";
import { createCookie, createSessionStorage } from "react-router";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";
import type { UserRow } from "./tables.server.ts";

const MAX_AGE_S = 60 * 60 * 24 * 14;

interface SessionData {
  userId: number;
  deviceId?: string;
}
interface FlashData {
  notice: string;
}

let sessionCookie: ReturnType<typeof createCookie> | undefined;
function cookie() {
  return (sessionCookie ??= createCookie("__sternpost", {
    httpOnly: true,
    sameSite: "lax",
    path: "/",
    secure: env().APP_URL.startsWith("https:"),
    secrets: [env().SESSION_SECRET],
    maxAge: MAX_AGE_S,
  }));
}

/**
 * The id of the signed-in person and their user row, read with the session in one query (every
 * signed-in request asks this first), or null when the cookie names no live session.
 */
export async function sessionUserRow(request: Request): Promise<UserRow | null> {
  const header = request.headers.get("Cookie");
  const id = header ? await sessionIdIn(header) : null;
  if (!id) return null;
  const row: (UserRow & { session_expires_at: Date | null }) | undefined = await db()("sessions as s")
    .join("users as u", "u.id", "s.user_id")
    .where("s.id", id)
    .first("u.*", "s.expires_at as session_expires_at");
  if (!row || (await droppedIfExpired(id, row.session_expires_at))) return null;
  return row;
}

/**
 * The session id a Cookie header carries, if its signature holds. A header verifies the same way
 * every time, so each is checked once (an HMAC is 70–100 µs of the server's one thread, on every
 * signed-in request); whether the session still lives is asked every time. The list is bounded in
 * entries and in their size (at most 10,000 headers of 1 KB; the app's own cookie makes one of 112
 * bytes).
 */
const verified = new Map<string, string | null>();
const MAX_VERIFIED = 10_000;
const MAX_REMEMBERED_HEADER = 1024;
async function sessionIdIn(header: string): Promise<string | null> {
  let id = verified.get(header);
  if (id === undefined) {
    const parsed: unknown = await cookie().parse(header);
    id = typeof parsed === "string" && parsed ? parsed : null;
    if (header.length <= MAX_REMEMBERED_HEADER) {
      if (verified.size >= MAX_VERIFIED) verified.clear();
      verified.set(header, id);
    }
  }
  return id;
}

/** A session past its expiry is deleted on sight; says whether it was. */
async function droppedIfExpired(id: string, expiresAt: Date | null): Promise<boolean> {
  if (!expiresAt || new Date(expiresAt) >= new Date()) return false;
  await db()("sessions").where({ id }).delete();
  return true;
}

let storage: ReturnType<typeof createSessionStorage<SessionData, FlashData>> | undefined;

/** Sessions are rows in MariaDB, so every app instance sees the same ones. */
export function sessionStorage() {
  storage ??= createSessionStorage<SessionData, FlashData>({
    cookie: cookie(),
    async createData(data, expires) {
      const id = randomBytes(24).toString("base64url");
      await db()("sessions").insert({
        id,
        user_id: data.userId ?? null,
        data: JSON.stringify(data),
        expires_at: expires ?? null,
      });
      return id;
    },
    async readData(id) {
      const row = await db()("sessions").where({ id }).first();
      if (!row) return null;
      if (await droppedIfExpired(id, row.expires_at)) return null;
      return JSON.parse(row.data);
    },
    async updateData(id, data, expires) {
      await db()("sessions")
        .where({ id })
        .update({ user_id: data.userId ?? null, data: JSON.stringify(data), expires_at: expires ?? null });
    },
    async deleteData(id) {
      await db()("sessions").where({ id }).delete();
    },
  });
  return storage;
}

export function getSession(request: Request) {
  return sessionStorage().getSession(request.headers.get("Cookie"));
}

/** Ends every session of a user (deactivation, password change). */
export async function endSessionsOf(userId: number) {
  await db()("sessions").where({ user_id: userId }).delete();
}
