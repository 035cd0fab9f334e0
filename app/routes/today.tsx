import { useEffect, useEffectEvent, useState } from "react";
import { Link, useRevalidator } from "react-router";
import type { Route } from "./+types/today";
import { checklistStateLabels, type ChecklistState } from "~/lib/checklist-sets";
import { can } from "~/lib/permissions";
import { OfflineCapability } from "~/components/offline-capability";
import { requireUser } from "~/server/auth.server";
import { env } from "~/server/env.server";
import { listChecklistsOfJobs } from "~/server/checklists.server";
import { listVisibleJobs } from "~/server/jobs.server";
import { recordsIssuedTo } from "~/server/records.server";
import type { Role } from "~/lib/roles";
import { LocalTime } from "~/components/local-time";
import { plainError } from "~/lib/offline/plain-error";
import { queueKindLabels, type QueueEntry } from "~/lib/queue";
import { issuedRecently, returnedTo, waitingFor } from "~/server/queue.server";

export const meta: Route.MetaFunction = () => [{ title: "Today · Sternpost" }];

interface TodayJob {
  id: number;
  vesselName: string;
  engineModel: string;
  dueDate: string | null;
  checklists: { id: string; title: string; state: ChecklistState }[];
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const jobs = can(user, "jobs:view")
    ? (await listVisibleJobs(user)).filter((j) => j.status !== "completed")
    : [];
  const checklists = await listChecklistsOfJobs(jobs.map((j) => j.id));
  const withChecklists: TodayJob[] = jobs.map((j) => ({
    id: j.id,
    vesselName: j.vesselName,
    engineModel: j.engineModel,
    dueDate: j.dueDate,
    checklists: checklists.get(j.id)!,
  }));
  const records =
    user.role === "surveyor"
      ? (await recordsIssuedTo(user.id)).map((r) => ({
          id: r.id,
          vesselName: r.vessel_name,
          engineModel: r.engine_model,
          issuedAt: new Date(r.issued_at).toISOString(),
        }))
      : [];
  // Each role's own list of what waits for it, decided here from the role.
  const queue = user.role === "lead" || user.role === "manager" ? await waitingFor(user) : [];
  const returned = user.role === "technician" ? await returnedTo(user) : [];
  const issued = user.role === "manager" ? await issuedRecently() : [];
  // Where tablets can keep checklists offline, if this server is reached over https.
  const secureUrl = env().APP_URL.startsWith("https:") ? new URL(env().APP_URL).origin : null;
  return {
    name: user.name,
    role: user.role,
    jobs: withChecklists,
    records,
    queue,
    returned,
    issued,
    offline: false,
    secureUrl,
  };
}

/** With no connection, the jobs this tablet holds. */
export async function clientLoader({ serverLoader }: Route.ClientLoaderArgs) {
  try {
    return await serverLoader();
  } catch (error) {
    if (error instanceof Response) throw error;
    const store = await import("~/lib/offline/store.client");
    const user = await store.getMeta<{ name: string; role: Role }>("user");
    const jobs: TodayJob[] = (await store.listLocalJobs()).map((j) => ({
      id: j.id,
      vesselName: j.vesselName,
      engineModel: j.engineModel,
      dueDate: j.dueDate,
      checklists: j.checklists,
    }));
    return {
      name: user?.name ?? "",
      role: user?.role ?? "technician",
      jobs,
      records: [],
      queue: [],
      returned: [],
      issued: [],
      offline: true,
      secureUrl: null,
    };
  }
}

function OfflineReadiness() {
  const [state, setState] = useState<{ busy: boolean; message: string | null; readyAt: string | null }>({
    busy: false,
    message: null,
    readyAt: null,
  });
  const revalidator = useRevalidator();
  async function prepare(quiet = false) {
    setState((s) => ({ ...s, busy: true, message: quiet ? s.message : "Copying your jobs to this tablet…" }));
    try {
      const [{ takeOffline }, { calculatorPages }] = await Promise.all([
        import("~/lib/offline/take-offline.client"),
        import("~/lib/offline/calculator-pages"),
      ]);
      const done = await takeOffline(calculatorPages());
      const readyAt = localStorage.getItem("sternpost:offline-ready");
      setState({
        busy: false,
        readyAt,
        message: quiet
          ? null
          : `Ready offline: ${done.checklists} checklists and ${done.pages} pages on this tablet.`,
      });
      revalidator.revalidate();
    } catch (error) {
      setState((s) => ({ ...s, busy: false, message: `Not ready offline: ${plainError(error)}` }));
    }
  }
  const refreshQuietly = useEffectEvent(() => void prepare(true));
  useEffect(() => {
    const readyAt = localStorage.getItem("sternpost:offline-ready");
    setState((s) => ({ ...s, readyAt }));
    // Once a tablet holds the jobs, each visit with a connection refreshes them quietly.
    if (readyAt && navigator.onLine) refreshQuietly();
  }, []);
  return (
    <div className="card mb-6 flex flex-wrap items-center gap-4">
      <button type="button" className="btn btn-primary" disabled={state.busy} onClick={() => prepare()}>
        {state.busy
          ? "Copying…"
          : state.readyAt
            ? "Refresh the offline copy"
            : "Make my jobs available offline"}
      </button>
      <p role="status" data-testid="offline-readiness">
        {state.message ??
          (state.readyAt ? (
            <>
              Available offline since <LocalTime at={state.readyAt} />.
            </>
          ) : (
            "Do this once with a connection before going aboard."
          ))}
      </p>
    </div>
  );
}

/** What waits for the lead or the manager, oldest first, each a link to where it is done. */
function ReviewQueue({ entries }: { entries: QueueEntry[] }) {
  return (
    <section className="mb-6" aria-labelledby="queue-title">
      <h2 id="queue-title" className="mb-2 text-2xl font-bold">
        Waiting for you {entries.length > 0 && <span className="num">({entries.length})</span>}
      </h2>
      {entries.length === 0 ? (
        <p>Nothing waits for you: no checklist to review, no conflict to decide, no record to issue.</p>
      ) : (
        <ol className="flex flex-col gap-2" data-testid="review-queue">
          {entries.map((e) => (
            <li key={`${e.kind}-${e.to}`}>
              <Link
                to={e.to}
                className="card flex min-h-12 flex-wrap items-center justify-between gap-2 no-underline"
              >
                <span className="flex flex-col">
                  <span className="text-sm font-bold text-copper">{queueKindLabels[e.kind]}</span>
                  <span className="text-lg font-bold text-harbour underline">
                    {e.title} · {e.vessel}
                  </span>
                  <span className="text-ink-soft">{e.detail}</span>
                </span>
                <span className="text-sm text-ink-soft">
                  waiting since <LocalTime at={e.since} />
                </span>
              </Link>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

/** What the lead sent back to the technician, with the comments saying why. */
function ReturnedList({
  entries,
}: {
  entries: { id: string; since: string; title: string; vessel: string; comments: string[] }[];
}) {
  if (!entries.length) return null;
  return (
    <section className="mb-6" aria-labelledby="returned-title">
      <h2 id="returned-title" className="mb-2 text-2xl font-bold">
        Returned to you <span className="num">({entries.length})</span>
      </h2>
      <ol className="flex flex-col gap-2" data-testid="returned-queue">
        {entries.map((e) => (
          <li key={e.id} className="card flex flex-col gap-1">
            <Link to={`/checklists/${e.id}`} className="text-lg font-bold text-harbour underline">
              {e.title} · {e.vessel}
            </Link>
            <span className="text-sm text-ink-soft">
              returned <LocalTime at={e.since} />
            </span>
            {e.comments.length ? (
              <ul className="ml-5 list-disc">
                {e.comments.map((c, i) => (
                  <li key={i}>{c}</li>
                ))}
              </ul>
            ) : (
              <p>The lead left no comment on an item.</p>
            )}
          </li>
        ))}
      </ol>
    </section>
  );
}

/** The records the yard issued lately, and whether each surveyor has opened them. */
function IssuedList({
  entries,
}: {
  entries: {
    id: string;
    issuedAt: string;
    vessel: string;
    engineModel: string;
    to: { email: string; opened: boolean }[];
  }[];
}) {
  return (
    <section className="mb-6" aria-labelledby="issued-title">
      <h2 id="issued-title" className="mb-2 text-2xl font-bold">
        Issued in the last 30 days
      </h2>
      {entries.length === 0 ? (
        <p>No record issued in the last 30 days.</p>
      ) : (
        <ul className="flex flex-col gap-2" data-testid="issued-recently">
          {entries.map((r) => (
            <li key={r.id}>
              <Link to={`/records/${r.id}`} className="card flex flex-col no-underline">
                <span className="text-lg font-bold text-harbour underline">
                  {r.vessel} · {r.engineModel}
                </span>
                <span className="text-ink-soft">
                  issued <LocalTime at={r.issuedAt} style="date" /> to{" "}
                  {r.to.map((x) => `${x.email} (${x.opened ? "opened" : "not opened yet"})`).join(", ")}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

export default function Today({ loaderData }: Route.ComponentProps) {
  const { name, role, jobs, records, queue, returned, issued, offline, secureUrl } = loaderData;
  return (
    <>
      <h1 className="mb-2 text-3xl font-bold">Good to see you, {name.split(" ")[0]}</h1>
      {role === "surveyor" ? (
        <>
          <p className="mb-4 text-lg">
            {records.length
              ? "Commissioning records issued to you:"
              : "Commissioning records issued to you will appear here."}
          </p>
          <ul className="flex flex-col gap-3" data-testid="issued-records">
            {records.map((r) => (
              <li key={r.id}>
                <Link to={`/records/${r.id}`} className="card flex flex-col no-underline">
                  <span className="text-xl font-bold text-ink">{r.vesselName}</span>
                  <span className="text-ink-soft">
                    {r.engineModel} · issued <LocalTime at={r.issuedAt} style="date" />
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        </>
      ) : (
        <>
          {!offline && (role === "lead" || role === "manager") && <ReviewQueue entries={queue} />}
          {!offline && role === "technician" && <ReturnedList entries={returned} />}
          {!offline && role === "manager" && <IssuedList entries={issued} />}
          <OfflineCapability secureUrl={secureUrl}>
            <OfflineReadiness />
          </OfflineCapability>
          <p className="mb-4 text-lg">
            {offline
              ? "No connection: the jobs on this tablet."
              : role === "technician"
                ? "The jobs you are assigned to:"
                : "Open jobs:"}
          </p>
          {jobs.length === 0 && <p>No open jobs.</p>}
          <ul className="grid gap-4 md:grid-cols-2">
            {jobs.map((j) => (
              <li key={j.id} className="card flex flex-col gap-2" data-testid={`job-${j.id}`}>
                {offline ? (
                  <span className="text-xl font-bold">{j.vesselName}</span>
                ) : (
                  <Link to={`/jobs/${j.id}`} className="text-xl font-bold text-harbour underline">
                    {j.vesselName}
                  </Link>
                )}
                <span className="text-ink-soft">
                  {j.engineModel} · due {j.dueDate ?? "—"}
                </span>
                <ul className="flex flex-col">
                  {j.checklists.map((c) => (
                    <li key={c.id}>
                      <Link
                        to={`/checklists/${c.id}`}
                        className="flex min-h-12 items-center justify-between gap-2 border-t border-rule no-underline"
                      >
                        <span className="font-bold text-ink">{c.title}</span>
                        <span className="text-sm text-ink-soft">{checklistStateLabels[c.state]}</span>
                      </Link>
                    </li>
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}
