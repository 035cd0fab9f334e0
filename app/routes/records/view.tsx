import { Link } from "react-router";
import type { Route } from "./+types/view";
import { CalcDiagram } from "~/components/checklist/calc-diagram";
import { VerdictBadge } from "~/components/checklist/verdict-badge";
import { earlierRevisions } from "~/lib/record/earlier";
import { inWorkOrder } from "~/lib/record/order";
import { describeRule, describeValue, progress } from "~/lib/templates";
import { jobScopeLabels } from "~/lib/validation/jobs";
import { audit } from "~/server/audit.server";
import { inBackground, recordOpened } from "~/server/notifications.server";
import { requireRecord } from "~/server/record-access.server";
import { LocalTime, useYardTimeZone } from "~/components/local-time";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Record: ${data?.record.content.vessel.name ?? ""} · Sternpost` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { user, record } = await requireRecord(request, params.recordId);
  if (user.role === "surveyor")
    await audit({ userId: user.id, action: "record.viewed", entity: "record", entityId: record.id });
  inBackground(recordOpened(user, record.id)); // the job's lead hears of the first opening
  return { record };
}

const when = (at?: string) => (at ? <LocalTime at={at} style="medium" /> : "—");

export default function RecordView({ loaderData }: Route.ComponentProps) {
  const { record } = loaderData;
  const zone = useYardTimeZone();
  const { vessel, job } = record.content;
  const checklists = inWorkOrder(record.content.checklists);
  return (
    <>
      <p className="font-bold text-copper">{record.content.yardName} · Commissioning record</p>
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <h1 className="text-3xl font-bold">{vessel.name}</h1>
        <div className="flex flex-wrap gap-2">
          <a className="btn btn-primary" href={`/records/${record.id}/pdf`} download>
            Download the PDF
          </a>
          <a className="btn" href={`/records/${record.id}/json`} download>
            Download as data (JSON)
          </a>
          <Link className="btn" to={`/verify/${record.id}`}>
            Check it is genuine
          </Link>
        </div>
      </div>
      <section className="card mb-6">
        <dl className="grid grid-cols-2 gap-3 md:grid-cols-4">
          <div>
            <dt className="text-sm text-ink-soft">HIN</dt>
            <dd className="font-mono font-bold">{vessel.hin ?? "—"}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Work</dt>
            <dd className="font-bold">{jobScopeLabels[job.scope]}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Engine</dt>
            <dd className="font-bold">
              {job.engineModel}, serial {job.engineSerial}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Rated</dt>
            <dd className="num font-bold">
              {job.ratedPowerHp} hp, {job.ratedRpmMin}–{job.ratedRpmMax} rpm
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Gear</dt>
            <dd className="num font-bold">{job.gearRatio} : 1</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Propeller</dt>
            <dd className="num font-bold">
              {job.propDiameterIn} × {job.propPitchIn} in, {job.propBlades} blades
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Shaft</dt>
            <dd className="num font-bold">
              {job.shaftDiameterIn} in, {job.shaftMaterial}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Issued</dt>
            <dd className="font-bold">{when(record.issuedAt)}</dd>
          </div>
        </dl>
        <p className="mt-3 text-sm break-all">
          Record digest (SHA-256):{" "}
          <span className="font-mono" data-testid="record-digest">
            {record.digest}
          </span>
        </p>
      </section>
      {checklists.map((c) => {
        const values = Object.fromEntries(Object.entries(c.responses).map(([k, r]) => [k, r.value]));
        const state = progress(c.template, values);
        return (
          <section key={c.id} className="mb-8" data-testid="record-checklist">
            <h2 className="text-2xl font-bold">
              {c.template.title} <span className="text-base font-normal">version {c.templateVersion}</span>
            </h2>
            <p className="mb-3">
              Submitted by {c.submittedBy} ({when(c.submittedAt)}); countersigned by{" "}
              <strong>{c.countersignedBy}</strong> ({when(c.countersignedAt)}). Digest{" "}
              <span className="font-mono text-sm break-all">{c.digest}</span>
            </p>
            {c.template.sections.map((section) => (
              <div key={section.key} className="mb-4">
                <h3 className="mb-2 text-xl font-bold">{section.title}</h3>
                <ul className="flex flex-col gap-2">
                  {section.items.map((item) => {
                    const response = c.responses[item.key];
                    const earlier = response ? earlierRevisions(item, c.history[item.key], response.rev) : [];
                    return (
                      <li key={item.key} className="card flex flex-col gap-1">
                        <p className="font-bold">{item.label}</p>
                        {"rule" in item && item.rule && (
                          <p className="text-sm">Accept: {describeRule(item.rule)}</p>
                        )}
                        <p className="num">
                          {item.kind === "calc" ? "" : describeValue(item, response?.value, zone)}
                        </p>
                        {earlier.length > 0 && (
                          <p className="text-sm text-ink-soft" data-testid="earlier">
                            Earlier:{" "}
                            {earlier.map((h) => `${describeValue(item, h.value, zone)} (${h.by})`).join("; ")}
                          </p>
                        )}
                        {c.photos.some((p) => p.itemKey === item.key) && (
                          <div className="flex flex-wrap gap-2">
                            {c.photos
                              .filter((p) => p.itemKey === item.key)
                              .map((p) => (
                                <a
                                  key={p.id}
                                  href={`/records/${record.id}/photos/${p.id}`}
                                  target="_blank"
                                  rel="noreferrer"
                                >
                                  <img
                                    src={`/records/${record.id}/photos/${p.id}`}
                                    alt={`Photo for ${item.label}`}
                                    className="h-32 w-auto rounded border border-rule"
                                    data-testid="record-photo"
                                  />
                                </a>
                              ))}
                          </div>
                        )}
                        <VerdictBadge verdict={state.verdicts[item.key]!} />
                        <CalcDiagram
                          item={item}
                          template={c.template}
                          responses={values}
                          verdict={state.verdicts[item.key]!}
                        />
                        {c.comments
                          .filter((m) => m.itemKey === item.key)
                          .map((m, i) => (
                            <p key={i} className="text-sm">
                              Review comment: {m.text} ({m.by})
                            </p>
                          ))}
                        {response && (
                          <p className="text-sm text-ink-soft">
                            By {response.by}, {when(response.at)}
                          </p>
                        )}
                      </li>
                    );
                  })}
                </ul>
              </div>
            ))}
          </section>
        );
      })}
    </>
  );
}
