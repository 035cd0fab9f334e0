/**
 * Runs a whole database transaction again when the server aborted it for a deadlock. On one
 * MariaDB that is InnoDB picking a victim; on a Galera cluster it is also how a transaction that
 * lost certification against a concurrent commit on another node is reported (error 1213), and
 * the documented answer to both is to retry the transaction from its start.
 */
const RETRYABLE = new Set([
  1213, // ER_LOCK_DEADLOCK, and Galera's certification failure
  1205, // ER_LOCK_WAIT_TIMEOUT
]);

export function isRetryable(error: unknown): boolean {
  const errno = (error as { errno?: number } | null)?.errno;
  return typeof errno === "number" && RETRYABLE.has(errno);
}

/** `alsoRetry`: more error numbers the caller knows a fresh run answers (e.g. a duplicate key). */
export async function withRetry<T>(
  run: () => Promise<T>,
  { attempts = 6, alsoRetry = [] as number[] } = {},
): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await run();
    } catch (error) {
      const errno = (error as { errno?: number } | null)?.errno;
      const again = isRetryable(error) || (typeof errno === "number" && alsoRetry.includes(errno));
      if (!again || attempt >= attempts) throw error;
      // A short, growing, jittered pause so two nodes' retries do not collide again in step.
      await new Promise((r) => setTimeout(r, Math.random() * 10 * 2 ** attempt));
    }
  }
}
