import { useEffect, useRef, useState } from "react";
import { useRevalidator } from "react-router";
import { TwoStepButton } from "~/components/library/two-step-button";
import {
  addPhoto,
  localPhoto,
  onPhotosChanged,
  photoUrl,
  type PhotoState,
} from "~/lib/offline/photos.client";
import { LocalStoreError } from "~/lib/offline/store.client";
import { plainError } from "~/lib/offline/plain-error";
import type { PhotoItem, PhotoValue } from "~/lib/templates";
import type { EditorProps } from "./editors.tsx";

interface Shown {
  url: string;
  /** "stored": this tablet has no copy; the photo comes from the server. */
  state: PhotoState | "stored";
  problem?: string;
}

const stateWords: Record<Exclude<PhotoState, "refused">, string> = {
  waiting: "On this tablet · waiting to send",
  sent: "Sent",
};

function countWords(count: number, min: number): string {
  const photos = (n: number) => (n === 1 ? "1 photo" : `${n} photos`);
  return count >= min
    ? `${photos(count)} · at least ${min} needed`
    : `${count} of at least ${photos(min)} taken`;
}

/**
 * A photo item: the camera (or the tablet's pictures) through one big button, the photos as
 * thumbnails with where each one is (on the tablet, sent, refused), the count against the
 * item's minimum, and removal while the checklist is open. Photos show from the tablet's own
 * copy first, so they are there offline and after a reload.
 */
export function PhotoEditor({
  item,
  value,
  by,
  disabled,
  onSave,
  checklistId,
}: EditorProps<PhotoItem> & { checklistId: string }) {
  const photos = (value as PhotoValue | undefined)?.photos ?? [];
  const ids = photos.map((p) => p.id).join(" ");
  const [shown, setShown] = useState<Record<string, Shown>>({});
  const [version, setVersion] = useState(0);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const input = useRef<HTMLInputElement>(null);
  const revalidator = useRevalidator();

  useEffect(() => onPhotosChanged(() => setVersion((v) => v + 1)), []);

  useEffect(() => {
    let live = true;
    (async () => {
      const next: Record<string, Shown> = {};
      for (const id of ids ? ids.split(" ") : []) {
        const [url, local] = await Promise.all([photoUrl(id), localPhoto(id).catch(() => undefined)]);
        next[id] = { url, state: local?.state ?? "stored", problem: local?.problem };
      }
      if (live) setShown(next);
      else for (const s of Object.values(next)) if (s.url.startsWith("blob:")) URL.revokeObjectURL(s.url);
    })();
    return () => void (live = false);
  }, [ids, version]);

  // Object URLs are let go once the next set is on screen, or when the item leaves it.
  useEffect(() => {
    const urls = Object.values(shown)
      .map((s) => s.url)
      .filter((u) => u.startsWith("blob:"));
    return () => urls.forEach((u) => URL.revokeObjectURL(u));
  }, [shown]);

  async function take(files: FileList | null) {
    if (!files?.length) return;
    setBusy(true);
    setError(null);
    try {
      for (const file of Array.from(files)) await addPhoto({ checklistId, itemKey: item.key, by }, file);
    } catch (e) {
      setError(
        e instanceof LocalStoreError ? e.message : plainError(e, "This file could not be kept as a photo."),
      );
    } finally {
      setBusy(false);
      if (input.current) input.current.value = "";
    }
    revalidator.revalidate();
    const { refreshStatus, requestSync } = await import("~/lib/offline/status.client");
    void refreshStatus().then(() => (navigator.onLine ? requestSync() : undefined));
  }

  return (
    <div className="flex flex-col gap-3">
      <p className="font-bold" data-testid="photo-count">
        {countWords(photos.length, item.minPhotos)}
      </p>
      {photos.length > 0 && (
        <ul className="flex flex-wrap gap-3" aria-label={`${item.label}: photos`}>
          {photos.map((photo, i) => {
            const s = shown[photo.id];
            return (
              <li
                key={photo.id}
                className="flex w-44 flex-col gap-1"
                data-testid="photo"
                data-photo-id={photo.id}
              >
                {s ? (
                  <a href={s.url} target="_blank" rel="noreferrer">
                    <img
                      src={s.url}
                      alt={`Photo ${i + 1} of ${photos.length}: ${item.label}`}
                      className="h-32 w-44 rounded-md border-2 border-rule bg-card object-cover"
                    />
                  </a>
                ) : (
                  <div className="h-32 w-44 rounded-md border-2 border-rule" aria-hidden="true" />
                )}
                {s?.state === "refused" ? (
                  <p role="alert" className="text-sm font-bold text-fault">
                    ▲ Not accepted by the server: {s.problem}
                  </p>
                ) : (
                  s &&
                  s.state !== "stored" && (
                    <p className="text-sm" data-testid="photo-state">
                      {stateWords[s.state]}
                    </p>
                  )
                )}
                {!disabled && (
                  <TwoStepButton
                    label={`Remove photo ${i + 1}`}
                    confirmLabel="Remove it"
                    danger
                    onConfirm={() => onSave({ photos: photos.filter((p) => p.id !== photo.id) })}
                  >
                    <p className="text-sm">It leaves this item's list; the item's history keeps it.</p>
                  </TwoStepButton>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {!disabled && (
        <div>
          <label
            className={`btn btn-primary text-lg focus-within:outline focus-within:outline-2 ${busy ? "opacity-60" : ""}`}
          >
            {photos.length ? "Take or add another photo" : "Take or add a photo"}
            <input
              ref={input}
              type="file"
              accept="image/*"
              capture="environment"
              multiple
              className="sr-only"
              disabled={busy}
              onChange={(e) => void take(e.target.files)}
            />
          </label>
        </div>
      )}
      {busy && <p role="status">Preparing the photo on this tablet…</p>}
      {error && (
        <p role="alert" className="font-bold text-fault">
          ▲ {error}
        </p>
      )}
    </div>
  );
}
