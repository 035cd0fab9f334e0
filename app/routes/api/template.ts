import type { Route } from "./+types/template";
import { can, canReadTemplateVersion } from "~/lib/permissions";
import { requireApiUser } from "~/server/auth.server";
import { findTemplateVersion } from "~/server/templates.server";

/** A template version's JSON. Published and retired versions are readable by the yard's staff; drafts by managers. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  if (!can(user, "library:view"))
    return Response.json({ error: "Your role may not use this." }, { status: 403 });
  const version = Number(params.version);
  if (!Number.isInteger(version) || version < 1)
    return Response.json({ error: "version must be a whole number, 1 or more." }, { status: 400 });
  const found = await findTemplateVersion(params.key, version);
  if (!found || !canReadTemplateVersion(user, found))
    return Response.json({ error: "There is no such template version." }, { status: 404 });
  return Response.json({ status: found.status, template: found.template });
}
