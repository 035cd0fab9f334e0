import bcrypt from "bcryptjs";
import { createHash, randomBytes } from "node:crypto";
import type { Role } from "~/lib/roles";
import { db } from "./db.server.ts";
import type { UserRow } from "./tables.server.ts";

export interface User {
  id: number;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  hasPassword: boolean;
}

const INVITATION_DAYS = 7;

export function toUser(row: UserRow): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    active: !!row.active,
    hasPassword: !!row.password_hash,
  };
}

export async function findUserById(id: number): Promise<User | undefined> {
  const row = await db()("users").where({ id }).first();
  return row ? toUser(row) : undefined;
}

export async function findUserByEmail(email: string) {
  const row = await db()("users").where({ email: email.toLowerCase() }).first();
  return row ? { ...toUser(row), passwordHash: row.password_hash as string | null } : undefined;
}

export async function listUsers(): Promise<User[]> {
  return (await db()("users").orderBy([{ column: "active", order: "desc" }, "name"])).map(toUser);
}

export async function listUsersByRole(role: Role): Promise<User[]> {
  return (await db()("users").where({ role, active: true }).orderBy("name")).map(toUser);
}

export const PASSWORD_COST = 10;
export const hashPassword = (password: string) => bcrypt.hash(password, PASSWORD_COST);
/** bcrypt reads only 72 bytes; a longer password never matches (none longer can be set). */
export const checkPassword = async (password: string, hash: string) => {
  const matches = await bcrypt.compare(password, hash);
  return matches && Buffer.byteLength(password, "utf8") <= 72;
};

const hashToken = (token: string) => createHash("sha256").update(token).digest("hex");

/** Creates (or re-invites) a user without a password and returns the one-time token. */
export async function inviteUser(
  input: { email: string; name: string; role: Role },
  invitedBy: number | null,
) {
  return db().transaction(async (trx) => {
    const email = input.email.toLowerCase();
    let user: { id: number; password_hash?: string | null } | undefined = await trx("users")
      .where({ email })
      .first();
    if (user?.password_hash)
      throw new InviteError("email", "Someone with this e-mail address already has an account.");
    if (!user) {
      const [id] = await trx("users").insert({ email, name: input.name, role: input.role, active: true });
      user = { id };
    } else {
      await trx("users").where({ id: user.id }).update({ name: input.name, role: input.role, active: true });
    }
    const token = randomBytes(32).toString("base64url");
    await trx("invitations").where({ user_id: user.id, used_at: null }).delete();
    await trx("invitations").insert({
      user_id: user.id,
      token_hash: hashToken(token),
      expires_at: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
      created_by: invitedBy,
    });
    return { userId: user.id as number, token };
  });
}

export class InviteError extends Error {
  constructor(
    public field: string,
    message: string,
  ) {
    super(message);
  }
}

export type InvitationState =
  { state: "valid"; user: User } | { state: "expired" | "used" | "unknown" | "deactivated" };

export async function lookUpInvitation(token: string): Promise<InvitationState> {
  const row = await db()("invitations")
    .where({ token_hash: hashToken(token) })
    .first();
  if (!row) return { state: "unknown" };
  if (row.used_at) return { state: "used" };
  if (new Date(row.expires_at) < new Date()) return { state: "expired" };
  const user = await findUserById(row.user_id);
  if (!user) return { state: "unknown" };
  if (!user.active) return { state: "deactivated" };
  return { state: "valid", user };
}

/** Sets the password from an invitation; the token works once. */
export async function acceptInvitation(token: string, password: string): Promise<InvitationState> {
  const hash = await hashPassword(password);
  return db().transaction(async (trx) => {
    const row = await trx("invitations")
      .where({ token_hash: hashToken(token) })
      .forUpdate()
      .first();
    const current = await lookUpInvitation(token);
    if (current.state !== "valid" || !row) return current;
    await trx("users")
      .where({ id: row.user_id })
      .update({ password_hash: hash, updated_at: trx.fn.now(3) });
    await trx("invitations").where({ id: row.id }).update({ used_at: new Date() });
    return current;
  });
}

export async function updateUser(id: number, changes: { role?: Role; active?: boolean; name?: string }) {
  await db()("users")
    .where({ id })
    .update({ ...changes, updated_at: db().fn.now(3) });
}
