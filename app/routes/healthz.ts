import { databaseIsUp } from "~/server/database-health.server";
import { RETRY_AFTER_S } from "~/server/http/answers.server";

/** For a load balancer: this instance answers and reaches the database (503 when it does not). */
export async function loader() {
  if (await databaseIsUp({ fresh: true })) return Response.json({ ok: true });
  return Response.json(
    { ok: false, error: "The database does not answer." },
    { status: 503, headers: { "Retry-After": String(RETRY_AFTER_S), "Cache-Control": "no-store" } },
  );
}
