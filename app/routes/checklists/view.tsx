import { lazy, Suspense, useEffect, useState } from "react";
import { Link, useFetcher, useLocation, useRevalidator } from "react-router";
import type { Route } from "./+types/view";
import { CalculationsContext } from "~/components/checklist/calculations-context";
import { FillItem } from "~/components/checklist/fill-item";
import { checklistStateLabels } from "~/lib/checklist-sets";
import { canFillJob } from "~/lib/permissions";
import {
  calculationsFor,
  findItem,
  progressWith,
  valueSchemaFor,
  type ItemValue,
  type Template,
} from "~/lib/templates";
import { requireChecklist } from "~/server/checklist-access.server";
import { checklistResponses } from "~/server/checklists.server";
import { commentsOn, openConflicts } from "~/server/offline.server";

// The lead's comments and the answers to them load only for a checklist that has some.
const ItemComments = lazy(() =>
  import("~/components/checklist/item-comments").then((m) => ({ default: m.ItemComments })),
);
const CommentSummary = lazy(() =>
  import("~/components/checklist/item-comments").then((m) => ({ default: m.CommentSummary })),
);
// Diagrams (and the calculations they redraw) load only when a calc item is on screen.
const CalcDiagram = lazy(() =>
  import("~/components/checklist/calc-diagram").then((m) => ({ default: m.CalcDiagram })),
);

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.checklist.title ?? "Checklist"} · Sternpost` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { user, checklist, job } = await requireChecklist(request, params.checklistId);
  const { template, ...summary } = checklist;
  return {
    source: "server" as const,
    me: user.name,
    checklist: {
      ...summary,
      canFill: canFillJob(user, job),
      comments: (await commentsOn([checklist.id])).map(({ checklistId: _, ...c }) => c),
    },
    template,
    responses: await checklistResponses(checklist.id),
    conflicts: (await openConflicts([checklist.id])).length,
    rejections: [] as { opId: string; itemKey: string; reason: string }[],
    job: { id: job.id, vesselName: job.vesselName },
  };
}

/** The tablet's own copy is what is shown and filled, online or not. */
export async function clientLoader({ params, serverLoader }: Route.ClientLoaderArgs) {
  const store = await import("~/lib/offline/store.client");
  let local = await store.readChecklist(params.checklistId);
  if (!local && navigator.onLine) {
    const { takeOffline } = await import("~/lib/offline/take-offline.client");
    await takeOffline().catch(() => undefined);
    local = await store.readChecklist(params.checklistId);
  }
  if (!local) {
    const data = await serverLoader();
    return { ...data, calculations: await calculationsFor(data.template) };
  }
  const jobs = await store.listLocalJobs();
  const job = jobs.find((j) => j.id === local.checklist.jobId);
  const me = (await store.getMeta<{ name: string }>("user"))?.name ?? "";
  return {
    source: "device" as const,
    me,
    checklist: local.checklist,
    template: local.template,
    responses: local.responses,
    conflicts: local.conflicts.length,
    rejections: local.rejections,
    job: { id: local.checklist.jobId, vesselName: job?.vesselName ?? "" },
    calculations: await calculationsFor(local.template),
  };
}
clientLoader.hydrate = true as const;

export async function clientAction({ request, params }: Route.ClientActionArgs) {
  // Posted as JSON by this screen's fetcher: the entry arrives as the value it is, never re-parsed.
  const body = (await request.json()) as { intent?: string; itemKey?: unknown; value?: unknown };
  const itemKey = String(body.itemKey ?? "");
  const store = await import("~/lib/offline/store.client");
  if (body.intent === "submit") {
    try {
      await store.queueSubmission(params.checklistId);
    } catch (error) {
      return {
        itemKey: "",
        error: error instanceof store.LocalStoreError ? error.message : "Not submitted.",
      };
    }
    const { requestSync, refreshStatus } = await import("~/lib/offline/status.client");
    void refreshStatus().then(() => (navigator.onLine ? requestSync() : undefined));
    return { itemKey: "", error: null };
  }
  const local = await store.readChecklist(params.checklistId);
  if (!local)
    return {
      itemKey,
      error: "This checklist is not on this tablet yet; connect once to make it available offline.",
    };
  const item = findItem(local.template, itemKey);
  if (!item) return { itemKey, error: "No such item on this checklist." };
  const parsed = valueSchemaFor(item).safeParse(body.value);
  if (!parsed.success) return { itemKey, error: `Not saved: ${parsed.error.issues[0]!.message}.` };
  const me = (await store.getMeta<{ name: string }>("user"))?.name ?? "";
  try {
    await store.recordEntry(params.checklistId, itemKey, parsed.data, me);
  } catch (error) {
    return {
      itemKey,
      error: error instanceof store.LocalStoreError ? error.message : "Not saved on this tablet.",
    };
  }
  const { requestSync, refreshStatus } = await import("~/lib/offline/status.client");
  void refreshStatus().then(() => (navigator.onLine ? requestSync() : undefined));
  return { itemKey, error: null };
}

function SubmitPanel({
  state,
  template,
  onJump,
  onSubmit,
}: {
  state: ReturnType<typeof progressWith>;
  template: Template;
  onJump: (section: number, itemKey: string) => void;
  onSubmit: () => void;
}) {
  const left = new Set(state.overall.left);
  const attention = new Set(state.overall.attention);
  // One tappable line per section with something missing, with its counts: not a long list of links.
  const sections = template.sections.flatMap((section, index) => {
    const keys = section.items.map((i) => i.key).filter((k) => left.has(k) || attention.has(k));
    if (!keys.length) return [];
    const unanswered = keys.filter((k) => !attention.has(k)).length;
    const flagged = keys.length - unanswered;
    const first = section.items.find((i) => i.key === keys[0])!;
    return [{ section, index, first, unanswered, flagged }];
  });
  return (
    <div className="card mt-6 flex flex-col gap-3" data-testid="submit-panel">
      <h2 className="text-xl font-bold">Submit for review</h2>
      {state.complete ? (
        <>
          <p>
            Every required item is done. Once submitted, the lead reviews it and it takes no more entries;
            with no connection it is sent with the next sync.
          </p>
          <div>
            <button type="button" className="btn btn-primary" onClick={onSubmit}>
              Submit for review
            </button>
          </div>
        </>
      ) : (
        <>
          <p>Before it can be submitted, go to:</p>
          <ul className="grid gap-2 sm:grid-cols-2" data-testid="missing-summary">
            {sections.map(({ section, index, first, unanswered, flagged }) => (
              <li key={section.key}>
                <button
                  type="button"
                  className="btn w-full justify-between text-left"
                  onClick={() => onJump(index, first.key)}
                >
                  <span className="flex flex-col">
                    <span>
                      Section {index + 1} · {section.title}
                    </span>
                    <span className="line-clamp-1 text-sm font-normal">First: {first.label}</span>
                  </span>
                  <span className="num shrink-0 text-sm">
                    {unanswered > 0 && <span>○ {unanswered} to answer</span>}
                    {unanswered > 0 && flagged > 0 && " · "}
                    {flagged > 0 && <span className="text-fault">▲ {flagged} to fix</span>}
                  </span>
                </button>
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

/** Where the technician was on a checklist (section and item), kept on this tablet: it reopens there, offline too. */
interface Place {
  section: string;
  item?: string;
}
const placeKey = (checklistId: string) => `sternpost:place:${checklistId}`;
function readPlace(checklistId: string): Place | null {
  try {
    const raw = typeof localStorage === "undefined" ? null : localStorage.getItem(placeKey(checklistId));
    const place = raw ? (JSON.parse(raw) as Partial<Place>) : null;
    return place && typeof place.section === "string" ? { section: place.section, item: place.item } : null;
  } catch {
    return null;
  }
}
function keepPlace(checklistId: string, place: Place) {
  try {
    localStorage.setItem(placeKey(checklistId), JSON.stringify(place));
  } catch {
    // A full or refused storage only loses the convenience, never an entry.
  }
}

export function HydrateFallback() {
  return <p className="text-lg">Opening the checklist on this tablet…</p>;
}

export default function ChecklistScreen({ loaderData }: Route.ComponentProps) {
  const { checklist, template, responses, job, me, calculations } = loaderData;
  const fetcher = useFetcher<typeof clientAction>();
  const revalidator = useRevalidator();
  // "#item-<key>" (as "Enter a new value" links) opens the checklist at that item; otherwise it
  // opens where the technician left it on this tablet.
  const { hash } = useLocation();
  const target = hash.startsWith("#item-") ? decodeURIComponent(hash.slice("#item-".length)) : null;
  const [opening] = useState(() => {
    const left = readPlace(checklist.id);
    const item = target ?? left?.item ?? null;
    const byItem = template.sections.findIndex((s) => s.items.some((i) => i.key === item));
    const bySection = template.sections.findIndex((s) => s.key === left?.section);
    return { item, section: Math.max(0, byItem >= 0 ? byItem : bySection) };
  });
  const [sectionIndex, setSectionIndex] = useState(opening.section);
  const [scrollTo, setScrollTo] = useState<string | null>(opening.item);
  useEffect(() => {
    if (!scrollTo) return;
    document.getElementById(`item-${scrollTo}`)?.scrollIntoView({ block: "center" });
    setScrollTo(null);
  }, [scrollTo, sectionIndex]);
  useEffect(() => {
    if (target) setScrollTo(target);
  }, [target]);
  const sectionKey = template.sections[sectionIndex]?.key ?? "";
  const [itemHere, setItemHere] = useState<string | undefined>(opening.item ?? undefined);
  useEffect(() => {
    keepPlace(checklist.id, { section: sectionKey, item: itemHere });
  }, [checklist.id, sectionKey, itemHere]);
  const goToSection = (index: number) => {
    setSectionIndex(index);
    setItemHere(undefined);
  };
  /** The item the technician is at: the last one touched or typed in. */
  const noteItem = (e: React.SyntheticEvent) => {
    const key = (e.target as HTMLElement).closest<HTMLElement>("[data-item]")?.dataset.item;
    if (key && key !== itemHere) setItemHere(key);
  };
  const values = Object.fromEntries(Object.entries(responses).map(([k, r]) => [k, r.value]));
  const state = progressWith(calculations, template, values);
  const locked = checklist.state === "submitted" || checklist.state === "countersigned";
  const editable = loaderData.source === "device" && checklist.canFill && !locked;
  const section = template.sections[sectionIndex] ?? template.sections[0]!;

  // Entries from other devices arrive with each sync: show them.
  useEffect(() => {
    let stop = () => {};
    import("~/lib/offline/status.client").then((m) => (stop = m.onSynced(() => revalidator.revalidate())));
    return () => stop();
  }, [revalidator]);

  const save = (itemKey: string) => (value: unknown) =>
    fetcher.submit(
      // An entry's value is plain JSON (a template value); clientAction checks it with its item's schema.
      { intent: "save", itemKey, value: value as ItemValue },
      { method: "post", encType: "application/json" },
    );
  const failed = fetcher.data?.error ? fetcher.data : null;

  return (
    <CalculationsContext value={calculations}>
      <p className="mb-1">
        <Link to={`/jobs/${job.id}`} className="font-bold text-harbour underline">
          ← {job.vesselName || "Job"}
        </Link>
      </p>
      <div className="mb-4 flex flex-wrap items-end justify-between gap-2">
        <h1 className="text-3xl font-bold">{checklist.title}</h1>
        <p className="text-lg">
          Version {checklist.version} · {checklistStateLabels[checklist.state]}
        </p>
      </div>
      <p className="mb-2" data-testid="overall-progress">
        <strong>
          {state.overall.left.length === 0
            ? "Every required item is done."
            : `${state.overall.left.length} required items left`}
        </strong>
        {state.overall.attention.length > 0 && (
          <>
            {" "}
            · <strong className="text-fault">▲ {state.overall.attention.length} need attention</strong>
          </>
        )}{" "}
        · {state.overall.done} of {state.overall.required} done
      </p>
      {locked && (
        <p className="mb-4 rounded-md border-2 border-harbour p-3">
          This checklist is {checklistStateLabels[checklist.state].toLowerCase()}: it takes no more entries.
        </p>
      )}
      {!checklist.canFill && !locked && (
        <p className="mb-4 rounded-md border-2 border-harbour p-3">
          You can read this checklist; its technicians and lead fill it.
        </p>
      )}
      {loaderData.rejections.length > 0 && (
        <div role="alert" className="mb-4 rounded-md border-2 border-fault bg-fault-light p-3">
          <strong>
            The server refused {loaderData.rejections.length} entr
            {loaderData.rejections.length === 1 ? "y" : "ies"}:
          </strong>
          <ul className="ml-5 list-disc">
            {loaderData.rejections.map((r) => (
              <li key={r.opId}>{r.reason}</li>
            ))}
          </ul>
        </div>
      )}
      {!locked && checklist.comments.length > 0 && (
        <Suspense fallback={null}>
          <CommentSummary comments={checklist.comments} template={template} onOpenSection={setSectionIndex} />
        </Suspense>
      )}
      <nav aria-label="Sections" className="mb-4 flex flex-wrap gap-2">
        {template.sections.map((s, i) => {
          const p = state.sections[i]!;
          return (
            <button
              key={s.key}
              type="button"
              className={`btn ${i === sectionIndex ? "btn-primary" : ""}`}
              aria-current={i === sectionIndex ? "step" : undefined}
              onClick={() => goToSection(i)}
            >
              {i + 1}. {s.title}{" "}
              <span className="num text-sm">
                {p.done}/{p.required}
                {p.attention.length ? " ▲" : ""}
              </span>
            </button>
          );
        })}
      </nav>
      <section aria-labelledby="section-title">
        <h2 id="section-title" className="mb-3 border-b-2 border-ink pb-1 text-2xl font-bold">
          {sectionIndex + 1}. {section.title}
        </h2>
        <ol className="flex flex-col gap-4" onFocusCapture={noteItem} onPointerDownCapture={noteItem}>
          {section.items.map((item) => (
            <FillItem
              key={item.key}
              item={item}
              template={template}
              responses={values}
              value={responses[item.key]?.value}
              verdict={state.verdicts[item.key]!}
              pending={!!responses[item.key]?.pending}
              by={me}
              disabled={!editable}
              onSave={save(item.key)}
              checklistId={checklist.id}
              diagram={
                item.kind === "calc" && (
                  <Suspense fallback={null}>
                    <CalcDiagram
                      item={item}
                      template={template}
                      responses={values}
                      verdict={state.verdicts[item.key]!}
                    />
                  </Suspense>
                )
              }
            >
              {checklist.comments.some((c) => c.itemKey === item.key) && (
                <Suspense fallback={null}>
                  <ItemComments
                    comments={checklist.comments.filter((c) => c.itemKey === item.key)}
                    checklistId={checklist.canFill && !locked ? checklist.id : undefined}
                  />
                </Suspense>
              )}
              {failed?.itemKey === item.key && (
                <p role="alert" className="font-bold text-fault">
                  ▲ {failed.error}
                </p>
              )}
            </FillItem>
          ))}
        </ol>
        {editable && (
          <SubmitPanel
            state={state}
            template={template}
            onJump={(index, itemKey) => {
              goToSection(index);
              setItemHere(itemKey);
              setScrollTo(itemKey);
            }}
            onSubmit={() =>
              fetcher.submit({ intent: "submit" }, { method: "post", encType: "application/json" })
            }
          />
        )}
        <div className="mt-6 flex justify-between gap-2">
          <button
            type="button"
            className="btn"
            disabled={sectionIndex === 0}
            onClick={() => goToSection(sectionIndex - 1)}
          >
            ← Previous section
          </button>
          <button
            type="button"
            className="btn"
            disabled={sectionIndex >= template.sections.length - 1}
            onClick={() => goToSection(sectionIndex + 1)}
          >
            Next section →
          </button>
        </div>
      </section>
    </CalculationsContext>
  );
}
