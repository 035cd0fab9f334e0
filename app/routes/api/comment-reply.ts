import type { Route } from "./+types/comment-reply";
import { can } from "~/lib/permissions";
import { Refusal } from "~/lib/refusal";
import { commentReplySchema } from "~/lib/validation/review";
import { requireApiUser } from "~/server/auth.server";
import { problem } from "~/server/problem.server";
import { replyToComment } from "~/server/review.server";

/** POST /api/checklists/:checklistId/replies — a technician answers a lead's comment. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") return problem(405, "Use POST.");
  const user = await requireApiUser(request);
  // The role first: a person with no jobs is refused before anything they sent is read.
  if (!can(user, "jobs:view")) return problem(403, "Only the people on a job answer its comments.");
  const form = await request.formData().catch(() => null);
  if (!form) return problem(400, "Send the answer as a form.");
  const parsed = commentReplySchema.safeParse(Object.fromEntries(form));
  if (!parsed.success) return problem(400, parsed.error.issues[0]!.message);
  try {
    const reply = await replyToComment(user, params.checklistId, parsed.data.commentId, parsed.data.text);
    return Response.json({ reply });
  } catch (error) {
    if (!(error instanceof Refusal)) throw error;
    return problem(error.status, error.message);
  }
}

export function loader() {
  return problem(405, "Use POST.");
}
