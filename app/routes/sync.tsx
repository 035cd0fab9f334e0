import { parseWithZod } from "@conform-to/zod/v4";
import { Link, useFetcher } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/sync";
import { describeValue, findItem } from "~/lib/templates";
import { formatMoment } from "~/lib/format";
import { LocalTime, useYardTimeZone } from "~/components/local-time";

export const meta: Route.MetaFunction = () => [{ title: "To decide · Sternpost" }];

/** Read from the tablet only: it works with no connection. */
export async function clientLoader() {
  const store = await import("~/lib/offline/store.client");
  const { localDb } = await import("~/lib/offline/db.client");
  const db = await localDb();
  const { conflicts, rejections } = await store.allConflicts();
  const describe = async (checklistId: string, itemKey: string) => {
    const checklist = await db.get("checklists", checklistId);
    const template = checklist ? await db.get("templates", [checklist.key, checklist.version]) : undefined;
    const job = checklist ? await db.get("jobs", checklist.jobId) : undefined;
    const item = template ? findItem(template.template, itemKey) : undefined;
    return {
      checklistTitle: checklist?.title ?? "A checklist",
      // Where it is: the vessel, the job, the checklist.
      place: [
        job?.vesselName,
        job ? `job ${job.id} (${job.engineModel})` : null,
        checklist?.title ?? "A checklist",
      ]
        .filter(Boolean)
        .join(" · "),
      item,
    };
  };
  return {
    conflicts: await Promise.all(
      conflicts.map(async (c) => {
        const { place, item } = await describe(c.checklistId, c.itemKey);
        return {
          ...c,
          place,
          label: item?.label ?? c.itemKey,
          server: describeValue(item, c.serverValue),
          sent: describeValue(item, c.clientValue),
        };
      }),
    ),
    rejections: await Promise.all(
      rejections.map(async (r) => {
        const { place, item } = await describe(r.checklistId, r.itemKey);
        return { ...r, place, label: item?.label ?? r.itemKey, sent: describeValue(item, r.value) };
      }),
    ),
  };
}

/** The two things this page posts: keep one side of a conflict, or dismiss a refusal once read. */
const decisionSchema = z.union([
  z.object({ intent: z.literal("dismiss"), opId: z.string().min(1) }),
  z.object({ conflictId: z.coerce.number().int().positive(), keep: z.enum(["server", "sent"]) }),
]);

export async function clientAction({ request }: Route.ClientActionArgs) {
  const submission = parseWithZod(await request.formData(), { schema: decisionSchema });
  if (submission.status !== "success") return { error: "That choice was not understood; reload the page." };
  const decision = submission.value;
  const store = await import("~/lib/offline/store.client");
  if ("opId" in decision) {
    await store.dismissRejection(decision.opId);
  } else {
    const { conflicts } = await store.allConflicts();
    const conflict = conflicts.find((c) => c.id === decision.conflictId);
    if (!conflict) return { error: "That conflict was already decided." };
    const me = (await store.getMeta<{ name: string }>("user"))?.name ?? "";
    const value = decision.keep === "sent" ? conflict.clientValue : conflict.serverValue;
    await store.recordEntry(conflict.checklistId, conflict.itemKey, value, me, [conflict.id]);
  }
  const { requestSync, refreshStatus } = await import("~/lib/offline/status.client");
  void refreshStatus().then(() => (navigator.onLine ? requestSync() : undefined));
  return { error: null };
}

export function HydrateFallback() {
  return <p>Reading this tablet…</p>;
}

export default function ToDecide({ loaderData }: Route.ComponentProps) {
  const fetcher = useFetcher();
  const zone = useYardTimeZone();
  const { conflicts, rejections } = loaderData;
  return (
    <>
      <h1 className="mb-2 text-3xl font-bold">To decide</h1>
      <p className="mb-6 text-lg">
        When two people changed the same entry while apart, both values are kept here until someone chooses.
        Nothing is overwritten on its own.
      </p>
      {conflicts.length === 0 && rejections.length === 0 && (
        <p data-testid="nothing-to-decide">Nothing to decide.</p>
      )}
      <ul className="flex flex-col gap-4">
        {conflicts.map((c) => (
          <li key={c.id} className="card flex flex-col gap-3" data-testid="conflict">
            <h2 className="text-xl font-bold">{c.label}</h2>
            <p className="text-ink-soft" data-testid="conflict-place">
              {c.place}
            </p>
            <div className="grid gap-3 md:grid-cols-2">
              <div className="rounded-md border-2 border-rule p-3">
                <p className="text-sm font-bold" data-testid="server-set-by">
                  On the server now
                  {c.serverBy &&
                    `, set by ${c.serverBy}${c.serverAt ? `, ${formatMoment(c.serverAt, zone)}` : ""}`}
                </p>
                <p className="num text-lg" data-testid="server-value">
                  {c.server}
                </p>
              </div>
              <div className="rounded-md border-2 border-rule p-3">
                <p className="text-sm font-bold">
                  Sent by {c.by}, <LocalTime at={c.at} />
                </p>
                <p className="num text-lg" data-testid="sent-value">
                  {c.sent}
                </p>
              </div>
            </div>
            <fetcher.Form method="post" className="flex flex-wrap gap-2">
              <input type="hidden" name="conflictId" value={c.id} />
              <button className="btn" name="keep" value="server">
                Keep the server's value
              </button>
              <button className="btn" name="keep" value="sent">
                Use the value that was sent
              </button>
              <Link className="btn" to={`/checklists/${c.checklistId}#item-${c.itemKey}`}>
                Enter a new value
              </Link>
            </fetcher.Form>
          </li>
        ))}
        {rejections.map((r) => (
          <li key={r.opId} className="card flex flex-col gap-2 border-fault" data-testid="rejection">
            <h2 className="text-xl font-bold">Refused: {r.label}</h2>
            <p className="text-ink-soft">{r.place}</p>
            <p>
              <strong>Why: </strong>
              {r.reason}
            </p>
            <p>
              <strong>What was sent: </strong>
              {r.sent}
            </p>
            <fetcher.Form method="post">
              <input type="hidden" name="opId" value={r.opId} />
              <button className="btn" name="intent" value="dismiss">
                Understood, remove
              </button>
            </fetcher.Form>
          </li>
        ))}
      </ul>
    </>
  );
}
