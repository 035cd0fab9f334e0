import { data } from "react-router";
import type { Route } from "./+types/verify";
import { formatStamp } from "~/lib/format";
import { verifyRecord } from "~/server/records.server";
import { yardSettings } from "~/server/yard.server";

export const meta: Route.MetaFunction = () => [{ title: "Verify a commissioning record · Sternpost" }];

/**
 * Public: what the QR code opens. It says whether the record is genuine and names what a reader
 * needs to match it to the paper in their hand (yard, vessel, HIN, engine and serial, the
 * checklists and who signed them) — no measurements, no addresses.
 */
export async function loader({ params }: Route.LoaderArgs) {
  const result = /^[0-9a-f-]{36}$/.test(params.recordId) ? await verifyRecord(params.recordId) : undefined;
  if (!result)
    throw data(
      { message: "No commissioning record has this number. Check the link or the QR code." },
      { status: 404 },
    );
  return { ...result, timeZone: (await yardSettings()).timeZone };
}

export default function Verify({ loaderData }: Route.ComponentProps) {
  const v = loaderData;
  // Read far from the yard, perhaps years later: the yard's clock, with its zone named.
  const when = (at?: string | null) => (at ? formatStamp(at, v.timeZone) : "—");
  return (
    <main className="mx-auto flex min-h-dvh max-w-2xl flex-col gap-6 p-6">
      <p className="font-bold text-copper">Sternpost · record verification</p>
      {v.genuine ? (
        <div className="rounded-lg border-4 border-sound bg-sound-light p-6" data-testid="verdict">
          <p className="text-3xl font-bold">
            <span aria-hidden="true">✓ </span>Genuine and unchanged
          </p>
          <p className="mt-2 text-lg">
            This commissioning record is the one issued on {when(v.issuedAt)}, and nothing in it has changed
            since each checklist was countersigned.
          </p>
        </div>
      ) : (
        <div className="rounded-lg border-4 border-fault bg-fault-light p-6" data-testid="verdict">
          <p className="text-3xl font-bold text-fault">
            <span aria-hidden="true">▲ </span>Changed — do not rely on this record
          </p>
          <ul className="mt-2 ml-5 list-disc text-lg">
            {v.problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </div>
      )}
      {v.identity && (
        <section aria-labelledby="what-title">
          <h2 id="what-title" className="text-xl font-bold">
            The record
          </h2>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1" data-testid="verify-identity">
            <dt className="text-ink-soft">Issued by</dt>
            <dd className="font-bold">{v.identity.yardName}</dd>
            <dt className="text-ink-soft">Vessel</dt>
            <dd className="font-bold">{v.identity.vesselName}</dd>
            <dt className="text-ink-soft">HIN</dt>
            <dd className="font-mono font-bold">{v.identity.hin ?? "none recorded"}</dd>
            <dt className="text-ink-soft">Engine</dt>
            <dd className="font-bold">{v.identity.engineModel}</dd>
            <dt className="text-ink-soft">Engine serial</dt>
            <dd className="font-mono font-bold">{v.identity.engineSerial}</dd>
          </dl>
        </section>
      )}
      <section aria-labelledby="signed-title">
        <h2 id="signed-title" className="text-xl font-bold">
          Checklists and their signers
        </h2>
        <ol className="mt-2 flex flex-col gap-2" data-testid="verify-checklists">
          {v.checklists.map((c) => (
            <li key={c.title} className="card">
              <p className="font-bold">
                {c.title} <span className="font-normal">version {c.version}</span>
              </p>
              <p>
                Filled in and submitted by {c.submittedBy ?? "—"} on {when(c.submittedAt)}
              </p>
              <p>
                Countersigned by {c.countersignedBy ?? "—"}, the job's lead, on {when(c.countersignedAt)}
              </p>
            </li>
          ))}
        </ol>
      </section>
      <p className="text-sm break-all">
        Record digest (SHA-256): <span className="font-mono">{v.digest}</span> — it must match the one printed
        on your copy.
      </p>
    </main>
  );
}
