import type { VersionStatus } from "~/server/library.server";

/**
 * A version's state in words and a shape, never colour alone. A published version that is not
 * the newest is "superseded": jobs that use it keep it, new jobs take the newer one.
 */
export function VersionStatusBadge({ status, newest }: { status: VersionStatus; newest: boolean }) {
  const look =
    status === "draft"
      ? { mark: "✎", text: "Draft", className: "border-brass bg-brass-light text-ink" }
      : status === "retired"
        ? { mark: "■", text: "Retired", className: "border-ink-soft bg-paper text-ink-soft" }
        : newest
          ? {
              mark: "●",
              text: "Published · new jobs start here",
              className: "border-sound bg-sound-light text-sound",
            }
          : { mark: "○", text: "Published · superseded", className: "border-rule bg-card text-ink-soft" };
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-md border-2 px-2 py-0.5 text-sm font-bold ${look.className}`}
      data-status={status}
    >
      <span aria-hidden="true">{look.mark}</span>
      {look.text}
    </span>
  );
}
