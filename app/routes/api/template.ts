import type { Route } from "./+types/template";
import { can, canReadTemplateVersion } from "~/lib/permissions";
import { requireApiUser } from "~/server/auth.server";
import { findTemplateVersion } from "~/server/templates.server";
import { problem } from "~/server/problem.server";

/** A template version's JSON. Published and retired versions are readable by the yard's staff; drafts by managers. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  if (!can(user, "library:view")) return problem(403, "Your role may not use this.");
  const version = Number(params.version);
  if (!Number.isInteger(version) || version < 1)
    return problem(400, "version must be a whole number, 1 or more.");
  const found = await findTemplateVersion(params.key, version);
  if (!found || !canReadTemplateVersion(user, found))
    return problem(404, "There is no such template version.");
  return Response.json({ status: found.status, template: found.template });
}
