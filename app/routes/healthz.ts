import { db } from "~/server/db.server";

/** For a load balancer: this instance answers and reaches the database. */
export async function loader() {
  await db().raw("SELECT 1");
  return Response.json({ ok: true });
}
