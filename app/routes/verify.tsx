import { data } from "react-router";
import type { Route } from "./+types/verify";
import { verifyRecord } from "~/server/records.server";

export const meta: Route.MetaFunction = () => [{ title: "Verify a commissioning record · Sternpost" }];

/** Public: what the QR code opens. It says whether the record is genuine, and nothing else about the job. */
export async function loader({ params }: Route.LoaderArgs) {
  const result = /^[0-9a-f-]{36}$/.test(params.recordId) ? await verifyRecord(params.recordId) : undefined;
  if (!result)
    throw data(
      { message: "No commissioning record has this number. Check the link or the QR code." },
      { status: 404 },
    );
  return result;
}

const when = (at?: string) =>
  at
    ? new Date(at).toLocaleString("en-GB", { dateStyle: "long", timeStyle: "short", timeZone: "UTC" }) +
      " UTC"
    : "—";

export default function Verify({ loaderData }: Route.ComponentProps) {
  const v = loaderData;
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
      <section>
        <h2 className="text-xl font-bold">Countersigned</h2>
        <ul className="mt-2 flex flex-col gap-1">
          {v.signers.map((s) => (
            <li key={s.checklist}>
              {s.checklist}: {s.countersignedBy} on {when(s.countersignedAt)}
            </li>
          ))}
        </ul>
      </section>
      <p className="text-sm break-all">
        Record digest (SHA-256): <span className="font-mono">{v.digest}</span> — it must match the one printed
        on your copy.
      </p>
    </main>
  );
}
