import { useEffect, useState } from "react";

/** Offers a new version of the app; the reload waits while entries are unsent or a form is half-filled. */
export function UpdatePrompt() {
  const [ready, setReady] = useState(false);
  const [blocked, setBlocked] = useState<string | null>(null);
  useEffect(() => {
    let stop = () => {};
    import("~/lib/pwa/register.client").then((m) => {
      m.registerWorker();
      stop = m.onUpdateReady(setReady);
    });
    return () => stop();
  }, []);
  if (!ready) return null;
  async function reload() {
    const [{ outboxCount }, { hasDirtyForms }, { applyUpdate }] = await Promise.all([
      import("~/lib/offline/store.client"),
      import("~/lib/pwa/dirty"),
      import("~/lib/pwa/register.client"),
    ]);
    const waiting = await outboxCount();
    if (waiting > 0)
      return setBlocked(`${waiting} entries are still waiting to send; reload once they have synced.`);
    if (hasDirtyForms()) return setBlocked("Save or clear the entry you are typing first.");
    await applyUpdate();
  }
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 bg-brass-light px-4 py-2 text-ink">
      <span className="font-bold">A new version of Sternpost is ready.</span>
      <button type="button" className="btn" onClick={reload}>
        Reload now
      </button>
      {blocked && <span>{blocked}</span>}
    </div>
  );
}
