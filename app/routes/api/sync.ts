import type { Route } from "./+types/sync";
import {
  describeProblems,
  MAX_OPS_PER_REQUEST,
  MAX_SYNC_BODY_BYTES,
  syncRequestSchema,
} from "~/lib/sync/protocol";
import { requireApiUser } from "~/server/auth.server";
import { inBackground, notifySubmitted, submittedBy } from "~/server/notifications.server";
import { sync } from "~/server/sync.server";

const problem = (status: number, error: string, extra: object = {}) =>
  Response.json({ error, ...extra }, { status });

/** POST /api/sync — push a batch of operations, pull the changes after the cursor. */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return problem(405, "Use POST.");
  const user = await requireApiUser(request);
  const declared = Number(request.headers.get("Content-Length") ?? 0);
  if (declared > MAX_SYNC_BODY_BYTES)
    return problem(413, `A sync request may be at most ${MAX_SYNC_BODY_BYTES} bytes.`);
  const text = await request.text();
  if (text.length > MAX_SYNC_BODY_BYTES)
    return problem(413, `A sync request may be at most ${MAX_SYNC_BODY_BYTES} bytes.`);
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return problem(400, "The body is not JSON.", { fields: [] });
  }
  if (
    body &&
    typeof body === "object" &&
    "ops" in body &&
    Array.isArray(body.ops) &&
    body.ops.length > MAX_OPS_PER_REQUEST
  ) {
    return problem(
      413,
      `A sync request may carry at most ${MAX_OPS_PER_REQUEST} operations; send the rest in the next request.`,
    );
  }
  const parsed = syncRequestSchema.safeParse(body);
  if (!parsed.success)
    return problem(400, "The sync request is malformed; nothing was applied.", {
      fields: describeProblems(parsed.error),
    });
  const answer = await sync(user, parsed.data);
  // The lead hears of a submission once it is committed; the tablet does not wait for the mail.
  inBackground(notifySubmitted(submittedBy(parsed.data.ops, answer.results)));
  return Response.json(answer);
}

export function loader() {
  return problem(405, "Use POST.");
}
