import type { Route } from "./+types/offline";
import { requireApiUser } from "~/server/auth.server";
import { offlineBundle } from "~/server/offline.server";

/** GET /api/offline — what a device stores to work this person's jobs with no connection. */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  if (user.role === "surveyor")
    return Response.json({ error: "Your role has no jobs to take offline." }, { status: 403 });
  return Response.json(await offlineBundle(user), { headers: { "Cache-Control": "no-store" } });
}
