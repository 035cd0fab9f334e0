import type { Route } from "./+types/template-export";
import { templateFileName } from "~/lib/templates";
import { readableVersion, templateFileText } from "~/server/library.server";
import { requireApiCapability } from "~/server/permissions.server";
import { problem } from "~/server/problem.server";

/** A version as a file for checklists/: the same format and layout, named <key>.v<version>.json. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiCapability(request, "library:view");
  const found = await readableVersion(user, params.key, Number(params.version));
  if (!found) return problem(404, "There is no such template version.");
  return new Response(templateFileText(found.template), {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Disposition": `attachment; filename="${templateFileName(found.template)}"`,
      "Cache-Control": "no-store",
    },
  });
}
