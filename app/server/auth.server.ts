import { parseWithZod } from "@conform-to/zod/v4";
import type { SubmissionResult } from "@conform-to/react";
import bcrypt from "bcryptjs";
import { redirect } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { loginSchema } from "~/lib/validation/people";
import { checkPassword, findUserByEmail, PASSWORD_COST, toUser, type User } from "./users.server.ts";
import { noteUser } from "./request-log.server.ts";
import { getSession, sessionStorage, sessionUserRow } from "./session.server.ts";
import {
  accountSlowdownMs,
  clearFailedLogins,
  loginBlockedFor,
  recordFailedLogin,
} from "./rate-limit.server.ts";

/** A sign-in refusal: the form's reply (never holding the password) and its HTTP status. */
export class LoginError extends Error {
  constructor(
    public reply: SubmissionResult<string[]>,
    public status = 400,
  ) {
    super(reply.error?.[""]?.[0] ?? "Sign-in refused");
  }
}

// The address the request came from, as the server saw it, handed to the strategy in a header that
// signIn always overwrites (remix-auth passes the strategy a copy of the request, not the original).
const ADDRESS_HEADER = "x-sternpost-sign-in-from";

// Compared against when the account is unknown or has no password yet, so every attempt costs one
// bcrypt comparison and the time taken does not tell which addresses have accounts.
let dummyHash: Promise<string> | undefined;
const unusableHash = () => (dummyHash ??= bcrypt.hash("no account has this password", PASSWORD_COST));

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

const authenticator = new Authenticator<User>();

authenticator.use(
  new FormStrategy(async ({ form, request }) => {
    const submission = parseWithZod(form, { schema: loginSchema });
    const refuse = (message?: string) =>
      new LoginError(
        submission.reply({ formErrors: message ? [message] : undefined, hideFields: ["password"] }),
      );
    if (submission.status !== "success") throw refuse();
    const { email, password } = submission.value;
    const address = request.headers.get(ADDRESS_HEADER) ?? "unknown";

    const minutes = await loginBlockedFor(email, address);
    if (minutes > 0) {
      throw refuse(
        `Too many failed sign-ins from here. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`,
      );
    }
    await sleep(await accountSlowdownMs(email));

    const found = await findUserByEmail(email);
    const matches = await checkPassword(password, found?.passwordHash ?? (await unusableHash()));
    // Same words for an unknown address and a wrong password: no account discovery.
    if (!found?.passwordHash || !matches) {
      await recordFailedLogin(email, address);
      throw refuse("That e-mail address and password do not match.");
    }
    if (!found.active) throw refuse("This account has been deactivated. Ask your shop manager.");
    await clearFailedLogins(email, address);
    const { passwordHash: _, ...user } = found;
    return user;
  }),
  "password",
);

/**
 * Signs in from the login form and returns the Set-Cookie header of a brand-new session (the one
 * the request carried, if any, is destroyed: no session fixation). Throws LoginError.
 */
export async function signIn(request: Request, clientAddress: string) {
  const headers = new Headers(request.headers);
  headers.set(ADDRESS_HEADER, clientAddress);
  let user: User;
  try {
    user = await authenticator.authenticate("password", new Request(request.clone(), { headers }));
  } catch (error) {
    // A body that is not a form at all (JSON, garbage): a refusal, not a server error.
    if (error instanceof TypeError) throw new LoginError({ status: "error", error: { "": [BAD_FORM] } }, 415);
    throw error;
  }
  return startSession(request, user.id);
}

/**
 * The Set-Cookie header of a brand-new session for this person; the one the request carried, if
 * any, is destroyed (no session fixation). For the sign-in form and an accepted invitation.
 */
export async function startSession(request: Request, userId: number) {
  const previous = await getSession(request);
  if (previous.id) await sessionStorage().destroySession(previous);
  const session = await sessionStorage().getSession();
  session.set("userId", userId);
  return sessionStorage().commitSession(session);
}

const BAD_FORM = "The sign-in form did not arrive as a form. Reload the page and try again.";

export async function signOut(request: Request) {
  const session = await getSession(request);
  return sessionStorage().destroySession(session);
}

/** The signed-in, active user, or null. */
export async function currentUser(request: Request): Promise<User | null> {
  const row = await sessionUserRow(request);
  if (!row) return null;
  const user = toUser(row);
  if (!user.active) return null;
  noteUser(request, user.id);
  return user;
}

/** Pages: send anonymous visitors to the sign-in page and back afterwards. */
export async function requireUser(request: Request): Promise<User> {
  const user = await currentUser(request);
  if (user) return user;
  const url = new URL(request.url);
  throw redirect(`/login?${new URLSearchParams({ redirectTo: url.pathname + url.search })}`);
}

/** API routes: 401 JSON instead of a redirect. */
export async function requireApiUser(request: Request): Promise<User> {
  const user = await currentUser(request);
  if (user) return user;
  throw Response.json({ error: "Sign in first." }, { status: 401 });
}
