/** The record PDF's photos: read once, checked against their recorded SHA-256, scaled into a grid. */
import { createHash } from "node:crypto";
import type { CommissioningRecord, RecordChecklist } from "~/lib/record/types";
import { type Item, type PhotoValue } from "~/lib/templates";
import { inkSoft, rule, fault, size, Writer } from "./record-pdf-writer.server.ts";
import { type RecordPdfOptions } from "./record-pdf-cover.server.ts";

export function photoReferences(
  checklist: RecordChecklist,
  item: Item,
  value: unknown,
): { id: string; sha256?: string }[] {
  const stored = checklist.photos.filter((p) => p.itemKey === item.key);
  const listed = item.kind === "photo" && value ? ((value as PhotoValue).photos ?? []) : [];
  const out: { id: string; sha256?: string }[] = stored.map((p) => ({ id: p.id, sha256: p.sha256 }));
  for (const p of listed) if (!out.some((o) => o.id === p.id)) out.push({ id: p.id, sha256: p.sha256 });
  return out;
}

/** A photo's file by id: its bytes when they match the recorded SHA-256, "differs" when they do not. */
export type PhotoFiles = Map<string, Buffer | "differs">;

/** Every photo the record refers to, read once before the pages are laid out. */
export async function readPhotoFiles(
  record: CommissioningRecord,
  photoBytes: RecordPdfOptions["photoBytes"],
): Promise<PhotoFiles> {
  const files: PhotoFiles = new Map();
  if (!photoBytes) return files;
  for (const checklist of record.checklists) {
    for (const item of checklist.template.sections.flatMap((s) => s.items)) {
      for (const photo of photoReferences(checklist, item, checklist.responses[item.key]?.value)) {
        if (files.has(photo.id)) continue;
        const bytes = await photoBytes(photo.id);
        if (!bytes) continue;
        // Only the file the record's digest covers is shown as that photo.
        const matches = !photo.sha256 || createHash("sha256").update(bytes).digest("hex") === photo.sha256;
        files.set(photo.id, matches ? bytes : "differs");
      }
    }
  }
  return files;
}

export const PICTURE = { width: 140, height: 105, gap: 8, caption: 12 };

/** The item's photos, scaled into a grid of boxes under their table, in the table's order. */
export function photoPictures(w: Writer, photos: { id: string }[], files: PhotoFiles, indent: number): void {
  const perRow = Math.max(1, Math.floor((w.width - indent + PICTURE.gap) / (PICTURE.width + PICTURE.gap)));
  const shown = photos
    .map((photo, i) => ({ n: i + 1, file: files.get(photo.id) }))
    .filter((p) => p.file !== undefined);
  for (let start = 0; start < shown.length; start += perRow) {
    w.ensure(PICTURE.height + PICTURE.caption + 6);
    const top = w.y + 3;
    shown.slice(start, start + perRow).forEach(({ n, file }, column) => {
      const x = w.left + indent + column * (PICTURE.width + PICTURE.gap);
      let caption = `Photo ${n}`;
      if (file === "differs") {
        caption = `Photo ${n}: the stored file does not match its SHA-256; not shown`;
      } else {
        try {
          w.doc.image(file!, x, top, {
            fit: [PICTURE.width, PICTURE.height],
            align: "center",
            valign: "center",
          });
          w.doc
            .save()
            .rect(x, top, PICTURE.width, PICTURE.height)
            .lineWidth(0.4)
            .strokeColor(rule)
            .stroke()
            .restore();
        } catch {
          // pdfkit embeds JPEG and PNG; a WebP photo is listed above but cannot be drawn.
          caption = `Photo ${n}: this file type cannot be shown in a PDF`;
        }
      }
      w.style("regular", size.tiny, file === "differs" ? fault : inkSoft);
      w.doc.text(w.printable(caption), x, top + PICTURE.height + 2, { width: PICTURE.width, lineGap: 1 });
    });
    w.y = top + PICTURE.height + PICTURE.caption + 4;
    w.doc.x = w.left;
  }
}
