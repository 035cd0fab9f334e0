import { data } from "react-router";
import type { Route } from "./+types/dev-mail";
import { listSunkMail } from "~/server/mail-sink.server";
import { LocalTime } from "~/components/local-time";
import { requireCapability } from "~/server/permissions.server";

export const meta: Route.MetaFunction = () => [{ title: "Mail caught locally · Sternpost" }];

/**
 * Only exists while the local SMTP sink is on (development, demo, tests), and only for a signed-in
 * manager: the messages hold invitation links, and reading one must not hand out an account.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const messages = await listSunkMail();
  if (messages) await requireCapability(request, "users:manage");
  if (!messages) throw data({ message: "No local mail sink is configured on this server." }, { status: 404 });
  return { messages };
}

const linkify = (text: string) =>
  text.split(/(https?:\/\/\S+)/g).map((part, i) =>
    /^https?:\/\//.test(part) ? (
      <a key={i} href={part} className="font-bold text-harbour underline">
        {part}
      </a>
    ) : (
      part
    ),
  );

export default function DevMail({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto max-w-3xl p-6">
      <h1 className="text-3xl font-bold">Mail caught by the local sink</h1>
      <p className="mt-2 text-ink-soft">Nothing here left this machine. Newest first.</p>
      {loaderData.messages.length === 0 && <p className="mt-6">No messages yet.</p>}
      <ol className="mt-6 flex flex-col gap-4">
        {loaderData.messages.map((m) => (
          <li key={m.id} className="card" data-testid="mail">
            <p className="text-sm text-ink-soft">
              <LocalTime at={m.receivedAt} style="full" /> · from {m.from} · to {m.to.join(", ")}
            </p>
            <h2 className="mt-1 text-xl font-bold">{m.subject}</h2>
            <pre className="mt-2 font-sans whitespace-pre-wrap">{linkify(m.text)}</pre>
          </li>
        ))}
      </ol>
    </main>
  );
}
