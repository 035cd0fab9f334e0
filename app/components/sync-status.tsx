import { useEffect, useState, useSyncExternalStore } from "react";
import { Link } from "react-router";
import type { SyncStatus } from "~/lib/offline/status.client";
import { formatCount, formatMoment } from "~/lib/format";
import { useYardTimeZone } from "~/components/local-time";

const initial: SyncStatus = {
  online: true,
  waiting: 0,
  conflicts: 0,
  refused: 0,
  lastSyncAt: null,
  syncing: false,
  problem: null,
  progress: null,
};

/** The status the brief asks to be always on screen: connection, waiting entries, last sync, conflicts. */
export function SyncStatusBar() {
  const zone = useYardTimeZone();
  const [store, setStore] = useState<typeof import("~/lib/offline/status.client") | null>(null);
  useEffect(() => {
    import("~/lib/offline/status.client").then((m) => {
      m.startSyncing();
      setStore(m);
    });
  }, []);
  const status = useSyncExternalStore(
    store?.syncStatus.subscribe ?? (() => () => {}),
    store?.syncStatus.get ?? (() => initial),
    () => initial,
  );
  const last = status.lastSyncAt ? formatMoment(status.lastSyncAt, zone, "time") : "not yet";
  return (
    <div
      className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm"
      data-testid="sync-status"
      aria-live="polite"
    >
      {/* Read at arm's length: a large word, and offline a distinct colour AND shape (a barred
          circle on a square plate) so it never rests on colour alone. The ring and the tight line
          height keep the sticky header as tall as it was. */}
      {status.online ? (
        <span
          className="flex items-center gap-2 rounded-full px-3 text-lg leading-5 font-bold ring-2 ring-sound-light"
          data-testid="connection"
          data-online="true"
        >
          <span aria-hidden="true" className="text-xl leading-5">
            ●
          </span>
          Online
        </span>
      ) : (
        <span
          className="flex items-center gap-2 rounded-sm bg-brass-light px-3 text-lg leading-5 font-bold text-ink ring-2 ring-paper"
          data-testid="connection"
          data-online="false"
        >
          <span aria-hidden="true" className="text-xl leading-5">
            ⊘
          </span>
          Offline · entries kept on this tablet
        </span>
      )}
      <span data-testid="waiting">
        {status.waiting === 0 ? "All entries sent" : `${status.waiting} waiting to send`}
      </span>
      <span>Last sync {last}</span>
      {status.conflicts + status.refused > 0 && (
        <Link
          to="/sync"
          className="rounded bg-brass-light px-2 py-1 font-bold text-ink"
          data-testid="conflict-badge"
        >
          ⚑ {status.conflicts} to decide{status.refused ? `, ${status.refused} refused` : ""}
        </Link>
      )}
      {status.progress && status.progress.total > 1 && (
        <span data-testid="sync-progress">
          Sent {formatCount(status.progress.sent)} of {formatCount(status.progress.total)}
        </span>
      )}
      {status.problem && (
        <span className="font-bold text-brass-light" data-testid="sync-problem">
          ▲ {status.problem}
        </span>
      )}
    </div>
  );
}
