import { RateLimiterMySQL, RateLimiterRes } from "rate-limiter-flexible";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";

const WINDOW_S = 15 * 60;

let limiter: RateLimiterMySQL | undefined;

/** Failed sign-ins, counted in MariaDB so the limit holds across app instances. */
function loginLimiter() {
  limiter ??= new RateLimiterMySQL({
    storeClient: db(),
    storeType: "knex",
    dbName: new URL(env().DATABASE_URL).pathname.slice(1),
    tableName: "rate_limits",
    tableCreated: true,
    keyPrefix: "login",
    points: env().LOGIN_ATTEMPTS,
    duration: WINDOW_S,
  });
  return limiter;
}

const keys = (email: string, address: string) => [`account:${email.toLowerCase()}`, `address:${address}`];

/** Minutes until sign-in is allowed again, or 0 when it is allowed now. */
export async function loginBlockedFor(email: string, address: string): Promise<number> {
  const states = await Promise.all(keys(email, address).map((k) => loginLimiter().get(k)));
  const blocked = states.filter((s): s is RateLimiterRes => !!s && s.remainingPoints <= 0);
  if (!blocked.length) return 0;
  return Math.ceil(Math.max(...blocked.map((s) => s.msBeforeNext)) / 60_000);
}

export async function recordFailedLogin(email: string, address: string) {
  await Promise.all(
    keys(email, address).map((k) =>
      loginLimiter()
        .consume(k)
        .catch((res) => {
          // Over the limit already: rate-limiter-flexible rejects with the state, which is fine here.
          if (!(res instanceof RateLimiterRes)) throw res;
        }),
    ),
  );
}

export async function clearFailedLogins(email: string) {
  await loginLimiter().delete(`account:${email.toLowerCase()}`);
}
