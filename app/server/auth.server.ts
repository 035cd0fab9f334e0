import { redirect } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { loginSchema } from "~/lib/validation/people";
import { checkPassword, findUserByEmail, findUserById, type User } from "./users.server.ts";
import { getSession, sessionStorage } from "./session.server.ts";
import { clearFailedLogins, loginBlockedFor, recordFailedLogin } from "./rate-limit.server.ts";

/** A sign-in refusal worded for the person at the door. */
export class LoginError extends Error {
  constructor(
    message: string,
    public countsAsFailure = true,
  ) {
    super(message);
  }
}

const authenticator = new Authenticator<User>();

authenticator.use(
  new FormStrategy(async ({ form }) => {
    const parsed = loginSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) throw new LoginError("Enter your e-mail address and password.", false);
    const found = await findUserByEmail(parsed.data.email);
    // Same words for an unknown address and a wrong password: no account discovery.
    if (!found?.passwordHash || !(await checkPassword(parsed.data.password, found.passwordHash))) {
      throw new LoginError("That e-mail address and password do not match.");
    }
    if (!found.active)
      throw new LoginError("This account has been deactivated. Ask your shop manager.", false);
    const { passwordHash: _, ...user } = found;
    return user;
  }),
  "password",
);

/** Signs in from the login form; returns the Set-Cookie header or throws LoginError. */
export async function signIn(request: Request, clientAddress: string) {
  const email = String((await request.clone().formData()).get("email") ?? "").trim();
  const minutes = await loginBlockedFor(email, clientAddress);
  if (minutes > 0) {
    throw new LoginError(
      `Too many failed sign-ins. This account is locked for ${minutes} more minute${minutes === 1 ? "" : "s"}.`,
      false,
    );
  }
  let user: User;
  try {
    user = await authenticator.authenticate("password", request);
  } catch (error) {
    if (error instanceof LoginError && error.countsAsFailure) await recordFailedLogin(email, clientAddress);
    throw error;
  }
  await clearFailedLogins(email);
  const session = await getSession(request);
  session.set("userId", user.id);
  return sessionStorage().commitSession(session);
}

export async function signOut(request: Request) {
  const session = await getSession(request);
  return sessionStorage().destroySession(session);
}

/** The signed-in, active user, or null. */
export async function currentUser(request: Request): Promise<User | null> {
  const session = await getSession(request);
  const id = session.get("userId");
  if (!id) return null;
  const user = await findUserById(id);
  return user?.active ? user : null;
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
