import { useEffect, useState, type ReactNode } from "react";
import type { WorkerStatus } from "~/lib/pwa/register.client";

/**
 * Shows its children (the "available offline" controls) only where a service worker can run;
 * elsewhere it says plainly why this address cannot keep checklists offline and where to go.
 * Browsers allow service workers only on https:// addresses and on the computer itself.
 */
export function OfflineCapability({
  secureUrl,
  children,
}: {
  secureUrl: string | null;
  children: ReactNode;
}) {
  const [status, setStatus] = useState<WorkerStatus>("pending");
  useEffect(() => {
    let stop = () => {};
    void import("~/lib/pwa/register.client").then((m) => {
      stop = m.onWorkerStatus(setStatus);
    });
    return () => {
      stop();
    };
  }, []);
  if (status !== "unsupported" && status !== "failed") return <>{children}</>;
  const here = typeof location === "undefined" ? "" : location.origin;
  return (
    <div className="card mb-6 border-l-8 border-fault" role="alert" data-testid="offline-unavailable">
      <p className="text-lg font-bold">This address cannot keep checklists offline.</p>
      <p className="mt-2">
        {status === "failed"
          ? "The offline helper of this browser could not start here, so nothing would be kept on this tablet."
          : `Tablets keep checklists offline only on an https:// address, and ${here} is not one.`}{" "}
        {secureUrl && secureUrl !== here ? (
          <>
            Open it at{" "}
            <a className="font-bold underline" href={secureUrl}>
              {secureUrl}
            </a>{" "}
            instead.
          </>
        ) : (
          <>
            Ask whoever runs the Sternpost server to start it with <code>npm start -- --lan</code> and open
            the https:// address it prints (the README explains the one-time step on each tablet).
          </>
        )}
      </p>
    </div>
  );
}
