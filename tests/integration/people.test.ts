import { afterAll, describe, expect, it } from "vitest";
import { currentUser, signIn } from "~/server/auth.server";
import { accountKey, accountSlowdownMs } from "~/server/rate-limit.server";
import { getSession, sessionStorage } from "~/server/session.server";
import { acceptInvitation, inviteUser, lookUpInvitation } from "~/server/users.server";
import { testDb } from "../support/db.ts";
import { makeUser, TEST_PASSWORD } from "../support/fixtures.ts";

const knex = testDb();
afterAll(() => knex.destroy());

const loginRequest = (email: string, password: string) =>
  new Request("http://test/login", { method: "POST", body: new URLSearchParams({ email, password }) });

describe("invitations", () => {
  it("create a user without a password whose link sets one, once", async () => {
    const email = `new-${Date.now()}@test.example`;
    const { userId, token } = await inviteUser({ email, name: "New Person", role: "technician" }, null);
    const row = (await knex("users").where({ id: userId }).first())!;
    expect(row.password_hash).toBeNull();
    expect((await lookUpInvitation(token)).state).toBe("valid");
    expect((await acceptInvitation(token, "a-new-password-1")).state).toBe("valid");
    expect((await lookUpInvitation(token)).state).toBe("used");
    expect((await acceptInvitation(token, "another-password")).state).toBe("used");
    await expect(signIn(loginRequest(email, "a-new-password-1"), "10.0.0.1")).resolves.toContain(
      "__sternpost=",
    );
  });

  it("refuse an expired invitation", async () => {
    const { userId, token } = await inviteUser(
      { email: `late-${Date.now()}@test.example`, name: "Late", role: "lead" },
      null,
    );
    await knex("invitations")
      .where({ user_id: userId })
      .update({ expires_at: new Date(Date.now() - 1000) });
    expect((await lookUpInvitation(token)).state).toBe("expired");
    expect((await acceptInvitation(token, "whatever-password")).state).toBe("expired");
    expect((await knex("users").where({ id: userId }).first())!.password_hash).toBeNull();
  });

  it("refuse an unknown token and an already registered address", async () => {
    expect((await lookUpInvitation("not-a-token")).state).toBe("unknown");
    const existing = await makeUser(knex, "lead");
    await expect(inviteUser({ email: existing.email, name: "Again", role: "lead" }, null)).rejects.toThrow(
      /already has an account/,
    );
  });
});

describe("sessions", () => {
  it("live in the database and end on sign-out", async () => {
    const user = await makeUser(knex, "manager");
    const cookie = await signIn(loginRequest(user.email, TEST_PASSWORD), "10.0.0.2");
    const sessionCookie = cookie.split(";")[0]!;
    const request = new Request("http://test/", { headers: { Cookie: sessionCookie } });
    expect((await currentUser(request))?.id).toBe(user.id);
    expect(await knex("sessions").where({ user_id: user.id }).count({ n: "*" })).toEqual([{ n: 1 }]);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    await sessionStorage().destroySession(await getSession(request));
    expect(await knex("sessions").where({ user_id: user.id }).count({ n: "*" })).toEqual([{ n: 0 }]);
    expect(await currentUser(request)).toBeNull();
  });

  it("stop working when the user is deactivated", async () => {
    const user = await makeUser(knex, "technician");
    const cookie = (await signIn(loginRequest(user.email, TEST_PASSWORD), "10.0.0.3")).split(";")[0]!;
    await knex("users").where({ id: user.id }).update({ active: false });
    expect(await currentUser(new Request("http://test/", { headers: { Cookie: cookie } }))).toBeNull();
    await expect(signIn(loginRequest(user.email, TEST_PASSWORD), "10.0.0.3")).rejects.toThrow(/deactivated/);
  });
});

describe("sign-in rate limits", () => {
  it("slow an account down after the allowed failures, without locking its owner out", async () => {
    const user = await makeUser(knex, "lead");
    for (let i = 0; i < 8; i++) {
      await expect(signIn(loginRequest(user.email, "wrong"), `10.1.0.${i}`)).rejects.toThrow(/do not match/);
    }
    // 3 failures past the allowance of 5 (from 8 addresses): held 3 × 250 ms, then let in.
    expect(await accountSlowdownMs(user.email)).toBe(750);
    const started = performance.now();
    await expect(signIn(loginRequest(user.email, TEST_PASSWORD), "10.1.1.1")).resolves.toContain(
      "__sternpost=",
    );
    expect(performance.now() - started).toBeGreaterThanOrEqual(700);
    // The count is a row in MariaDB, so every app instance sees it; success clears it.
    expect(await knex("rate_limits").where({ key: `login-account:${accountKey(user.email)}` })).toEqual([]);
  });

  it("limit an address that tries many accounts", async () => {
    const address = "10.2.0.9";
    // The integration setup allows 5 per pair, so 4 × 5 = 20 per address across accounts.
    for (let i = 0; i < 20; i++) {
      await expect(signIn(loginRequest(`nobody-${i}@test.example`, "x"), address)).rejects.toThrow(
        /do not match/,
      );
    }
    const user = await makeUser(knex, "manager");
    await expect(signIn(loginRequest(user.email, TEST_PASSWORD), address)).rejects.toThrow(/Too many/);
    await expect(signIn(loginRequest(user.email, TEST_PASSWORD), "10.2.0.10")).resolves.toContain(
      "__sternpost=",
    );
  });

  it("clear the pair's and the account's counts after a successful sign-in", async () => {
    const user = await makeUser(knex, "technician");
    await expect(signIn(loginRequest(user.email, "wrong"), "10.3.0.1")).rejects.toThrow();
    const keys = [`login-account:${accountKey(user.email)}`, `login-pair:${accountKey(user.email)}@10.3.0.1`];
    expect(await knex("rate_limits").whereIn("key", keys)).toHaveLength(2);
    await signIn(loginRequest(user.email, TEST_PASSWORD), "10.3.0.1");
    expect(await knex("rate_limits").whereIn("key", keys)).toEqual([]);
  });
});
