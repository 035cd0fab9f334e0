import type { Route } from "./+types/json";
import { recordJson } from "~/lib/record/json";
import { requireRecord } from "~/server/record-access.server";

/** The record as documented JSON (docs/record-json.md), with the same access as its PDF. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { record } = await requireRecord(request, params.recordId);
  const name = record.content.vessel.name.replace(/[^A-Za-z0-9]+/g, "-");
  return new Response(JSON.stringify(recordJson(record.content, record.digest), null, 2), {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Disposition": `attachment; filename="commissioning-record-${name}.json"`,
      "Cache-Control": "private, no-store",
    },
  });
}
