import { db, lastDatabaseAnswerAt } from "./db.server.ts";

/** How long one answer stands before the next request asks the database again. */
const FRESH_MS = 1_000;
/** A probe slower than this counts as "down": the app answers 503 instead of hanging. */
const PROBE_TIMEOUT_MS = 1_500;

let last: { up: boolean; at: number } | undefined;
let inFlight: Promise<boolean> | undefined;

async function probe(): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<boolean>((resolve) => {
    timer = setTimeout(() => resolve(false), PROBE_TIMEOUT_MS);
  });
  const query = db()
    .raw("SELECT 1")
    .then(() => true)
    .catch(() => false);
  try {
    return await Promise.race([query, timeout]);
  } finally {
    clearTimeout(timer);
  }
}

/** Whether MariaDB answers, asked at most once a second however many requests come in. */
export async function databaseIsUp({ fresh = false } = {}): Promise<boolean> {
  if (!fresh && last && Date.now() - last.at < FRESH_MS) return last.up;
  // A busy pool is not a database that is down: any query answered within the second will do.
  if (!fresh && Date.now() - lastDatabaseAnswerAt() < FRESH_MS) return true;
  inFlight ??= probe().then((up) => {
    last = { up, at: Date.now() };
    inFlight = undefined;
    return up;
  });
  return inFlight;
}
