import { data } from "react-router";
import { can, type Capability } from "~/lib/permissions";
import type { User } from "./users.server.ts";
import { requireApiUser, requireUser } from "./auth.server.ts";
import { problem } from "./problem.server.ts";

/** Throws a 403 page unless the condition holds. */
export function invariantForbidden(
  condition: unknown,
  message = "This page is not part of your work.",
): asserts condition {
  if (!condition) throw data({ message }, { status: 403 });
}

/** Throws a 404 page when the thing is missing. */
export function invariantFound<T>(value: T | null | undefined, message: string): asserts value is T {
  if (value === null || value === undefined) throw data({ message }, { status: 404 });
}

export async function requireCapability(request: Request, capability: Capability): Promise<User> {
  const user = await requireUser(request);
  invariantForbidden(can(user, capability));
  return user;
}

export async function requireApiCapability(request: Request, capability: Capability): Promise<User> {
  const user = await requireApiUser(request);
  if (!can(user, capability)) throw problem(403, "Your role may not use this.");
  return user;
}
