import { useState } from "react";
import type { ReviewComment } from "~/lib/sync/bundle";
import type { Template } from "~/lib/templates";
import { LocalTime } from "../local-time.tsx";

/** Posts an answer; a missing connection is said in words, never thrown to the error page. */
async function postAnswer(url: string, body: FormData): Promise<{ reply?: ReviewComment; error?: string }> {
  try {
    const response = await fetch(url, { method: "POST", body });
    const answer = (await response.json()) as { reply?: ReviewComment; error?: string };
    return response.ok ? answer : { error: answer.error ?? "Not sent." };
  } catch {
    return { error: "Not sent: answers need a connection. Your entries are kept on this tablet." };
  }
}

/** One lead's comment with the technician's answers under it, and (on the fill screen) a way to answer. */
function Thread({
  comment,
  replies,
  replyTo,
}: {
  comment: ReviewComment;
  replies: ReviewComment[];
  /** Where an answer is posted, when this person may answer now. */
  replyTo?: string;
}) {
  const [sent, setSent] = useState<ReviewComment[]>([]);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const all = [...replies, ...sent.filter((r) => !replies.some((x) => x.id === r.id))];
  async function answer(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setBusy(true);
    const result = await postAnswer(replyTo!, new FormData(form));
    setBusy(false);
    setError(result.error ?? null);
    if (result.reply) {
      setSent((s) => [...s, result.reply!]);
      form.reset();
    }
  }
  return (
    <div className="rounded-md border-2 border-harbour p-2" data-testid="review-comment">
      <p>
        <strong>Lead's comment: </strong>
        {comment.text}{" "}
        <span className="text-sm text-ink-soft">
          ({comment.by}, <LocalTime at={comment.at} />)
        </span>
      </p>
      {all.map((r) => (
        <p
          key={r.id ?? `${r.at}-${r.text}`}
          className="mt-2 ml-4 border-l-4 border-rule pl-2"
          data-testid="comment-reply"
        >
          <strong>Answer: </strong>
          {r.text}{" "}
          <span className="text-sm text-ink-soft">
            ({r.by}, <LocalTime at={r.at} />)
          </span>
        </p>
      ))}
      {replyTo && (
        <form
          method="post"
          action={replyTo}
          onSubmit={answer}
          className="mt-2 flex flex-wrap items-end gap-2"
        >
          <input type="hidden" name="commentId" value={comment.id} />
          <label className="flex flex-1 flex-col gap-1 font-bold">
            Answer the lead
            <input name="text" type="text" required maxLength={2000} className="field-input font-normal" />
          </label>
          <button className="btn" type="submit" disabled={busy}>
            Send answer
          </button>
          {error && (
            <p role="alert" className="w-full font-bold text-fault">
              ▲ {error}
            </p>
          )}
        </form>
      )}
    </div>
  );
}

/**
 * The comments on one item: each of the lead's, with the answers to it. `checklistId` is given
 * where the person may answer now (the technician, on a checklist back with them).
 */
export function ItemComments({ comments, checklistId }: { comments: ReviewComment[]; checklistId?: string }) {
  const leads = comments.filter((c) => !c.replyTo);
  if (!leads.length) return null;
  return (
    <div className="flex flex-col gap-2">
      {leads.map((c) => (
        <Thread
          key={c.id ?? `${c.at}-${c.text}`} // a copy taken before answers existed has no ids
          comment={c}
          replies={comments.filter((r) => r.replyTo === c.id)}
          replyTo={checklistId ? `/api/checklists/${checklistId}/replies` : undefined}
        />
      ))}
    </div>
  );
}

/**
 * At the top of a returned checklist: every comment of the lead's, each opening its item (the
 * fill screen shows one section at a time, so the section is opened first).
 */
export function CommentSummary({
  comments,
  template,
  onOpenSection,
}: {
  comments: ReviewComment[];
  template: Template;
  onOpenSection: (index: number) => void;
}) {
  const leads = comments.filter((c) => !c.replyTo);
  if (!leads.length) return null;
  const where = (itemKey: string) => {
    const index = template.sections.findIndex((s) => s.items.some((i) => i.key === itemKey));
    const item = template.sections[index]?.items.find((i) => i.key === itemKey);
    return { index, label: item?.label ?? itemKey };
  };
  return (
    <section
      className="card mb-4 border-2 border-harbour"
      aria-labelledby="comment-summary-title"
      data-testid="comment-summary"
    >
      <h2 id="comment-summary-title" className="mb-2 text-xl font-bold">
        The lead's comments ({leads.length})
      </h2>
      <ul className="flex flex-col gap-1">
        {leads.map((c) => {
          const { index, label } = where(c.itemKey);
          return (
            <li key={c.id ?? `${c.at}-${c.text}`}>
              <a
                href={`#item-${c.itemKey}`}
                className="flex min-h-12 flex-wrap items-center gap-x-2 rounded-md px-2 hover:bg-paper"
                onClick={(event) => {
                  event.preventDefault();
                  onOpenSection(index);
                  // Once the section is on screen, bring the item to the top.
                  requestAnimationFrame(() =>
                    document.getElementById(`item-${c.itemKey}`)?.scrollIntoView({ block: "start" }),
                  );
                }}
              >
                <strong className="text-harbour underline">
                  {index + 1}. {label}
                </strong>
                <span>{c.text}</span>
              </a>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
