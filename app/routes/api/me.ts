import type { Route } from "./+types/me";
import { requireApiUser } from "~/server/auth.server";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  return Response.json({ id: user.id, email: user.email, name: user.name, role: user.role });
}
