import { createHash } from "node:crypto";
import { RateLimiterMySQL, RateLimiterRes } from "rate-limiter-flexible";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";

const WINDOW_S = 15 * 60;
/** An address may fail this many times the per-pair allowance, across all accounts, per window. */
const ADDRESS_FACTOR = 4;
/** Each failure past the allowance slows the next sign-in to the account by this much... */
const SLOWDOWN_STEP_MS = 250;
/** ...up to this: an attacker is slowed, the owner is never locked out. */
const SLOWDOWN_MAX_MS = 3_000;

type Counter = "pair" | "address" | "account";
const limiters = new Map<Counter, RateLimiterMySQL>();

/** Failed sign-ins, counted in MariaDB so the limits hold across app instances. */
function limiter(counter: Counter) {
  let found = limiters.get(counter);
  if (!found) {
    const attempts = env().LOGIN_ATTEMPTS;
    found = new RateLimiterMySQL({
      storeClient: db(),
      storeType: "knex",
      dbName: new URL(env().DATABASE_URL).pathname.slice(1),
      tableName: "rate_limits",
      tableCreated: true,
      keyPrefix: `login-${counter}`,
      points: counter === "address" ? attempts * ADDRESS_FACTOR : attempts,
      duration: WINDOW_S,
    });
    limiters.set(counter, found);
  }
  return found;
}

// The account is hashed: keys stay short whatever the address length, and no e-mail sits in the table.
export const accountKey = (email: string) =>
  createHash("sha256").update(email.trim().toLowerCase()).digest("hex").slice(0, 40);

function keys(email: string, address: string): Record<Counter, string> {
  const account = accountKey(email);
  return { pair: `${account}@${address}`, address, account };
}

/** Minutes until this address may try this account again, or 0 when it may try now. */
export async function loginBlockedFor(email: string, address: string): Promise<number> {
  const k = keys(email, address);
  const states = await Promise.all([limiter("pair").get(k.pair), limiter("address").get(k.address)]);
  const blocked = states.filter((s): s is RateLimiterRes => !!s && s.remainingPoints <= 0);
  if (!blocked.length) return 0;
  return Math.ceil(Math.max(...blocked.map((s) => s.msBeforeNext)) / 60_000);
}

/** How long to hold a sign-in to this account: grows with its recent failures from anywhere. */
export async function accountSlowdownMs(email: string): Promise<number> {
  const state = await limiter("account").get(keys(email, "").account);
  const excess = state ? state.consumedPoints - env().LOGIN_ATTEMPTS : 0;
  return excess > 0 ? Math.min(excess * SLOWDOWN_STEP_MS, SLOWDOWN_MAX_MS) : 0;
}

export async function recordFailedLogin(email: string, address: string) {
  const k = keys(email, address);
  await Promise.all(
    (Object.keys(k) as Counter[]).map((counter) =>
      limiter(counter)
        .consume(k[counter])
        .catch((res) => {
          // Over the limit already: rate-limiter-flexible rejects with the state, which is fine here.
          if (!(res instanceof RateLimiterRes)) throw res;
        }),
    ),
  );
}

export async function clearFailedLogins(email: string, address: string) {
  const k = keys(email, address);
  await Promise.all([limiter("pair").delete(k.pair), limiter("account").delete(k.account)]);
}
