import PDFDocument from "pdfkit";
import { inWorkOrder } from "~/lib/record/order";
import type { CommissioningRecord } from "~/lib/record/types";
import {
  REGULAR,
  BOLD,
  fonts,
  MARGIN,
  ink,
  inkSoft,
  rule,
  size,
  Writer,
  TNUM,
} from "./record-pdf-writer.server.ts";
import { GOVERNING_STATEMENT } from "./record-pdf-words.server.ts";
import { readPhotoFiles } from "./record-pdf-photos.server.ts";
import { type RecordPdfOptions, cover } from "./record-pdf-cover.server.ts";
import { checklistPages } from "./record-pdf-checklist.server.ts";

export { GOVERNING_STATEMENT };
export type { RecordPdfOptions };

/**
 * The commissioning record as a PDF: a cover with the yard, vessel, job, installed equipment,
 * the record's digest and a QR code of its verification link, then every checklist item by item
 * with its value, verdict (in words and a drawn shape, never colour alone), acceptance rule,
 * every attempt, notes, the lead's comments, photo references (and the photos, scaled, when the
 * caller can read them) and computed results.
 * Fonts are the app's own Atkinson Hyperlegible TTFs, embedded (subset) in the file.
 */

function pageFurniture(w: Writer, record: CommissioningRecord): void {
  const { doc } = w;
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // Writing in the margins must not start new pages.
    const margins = { ...doc.page.margins };
    doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 };
    const pageNumber = i - range.start + 1;
    if (pageNumber > 1) {
      w.style("regular", size.small, inkSoft);
      doc.text(
        w.printable(`${record.yardName} · ${record.vessel.name} · Commissioning record`),
        MARGIN.left,
        34,
        { width: w.width * 0.6, lineBreak: false },
      );
      doc.text(w.printable(w.pageTitles[i - range.start] ?? ""), MARGIN.left + w.width * 0.6, 34, {
        width: w.width * 0.4,
        align: "right",
        lineBreak: false,
      });
      doc
        .save()
        .moveTo(MARGIN.left, 47)
        .lineTo(MARGIN.left + w.width, 47)
        .lineWidth(0.5)
        .strokeColor(rule)
        .stroke()
        .restore();
    }
    const footTop = doc.page.height - MARGIN.bottom + 14;
    doc
      .save()
      .moveTo(MARGIN.left, footTop - 6)
      .lineTo(MARGIN.left + w.width, footTop - 6)
      .lineWidth(0.5)
      .strokeColor(rule)
      .stroke()
      .restore();
    w.style("regular", size.tiny, inkSoft);
    doc.text(GOVERNING_STATEMENT, MARGIN.left, footTop, { width: w.width, lineGap: 1 });
    w.style("regular", size.small, ink);
    doc.text(w.printable(`Record ${record.record.id}`), MARGIN.left, footTop + 22, {
      width: w.width / 2,
      lineBreak: false,
      ...TNUM,
    });
    doc.text(`Page ${pageNumber} of ${range.count}`, MARGIN.left + w.width / 2, footTop + 22, {
      width: w.width / 2,
      align: "right",
      lineBreak: false,
      ...TNUM,
    });
    doc.page.margins = margins;
  }
}

export async function renderRecordPdf(
  record: CommissioningRecord,
  options: RecordPdfOptions,
): Promise<Buffer> {
  const { regular, bold } = fonts();
  const doc = new PDFDocument({
    size: "A4",
    margins: MARGIN,
    bufferPages: true,
    // The app's font from the first page on: no standard (unembedded) font enters the file.
    font: regular as unknown as string,
    lang: "en",
    displayTitle: true,
    info: {
      Title: `Commissioning record: ${record.vessel.name}`,
      Subject: `Job ${record.job.id} at ${record.yardName}; record ${record.record.id}; SHA-256 ${options.digest}`,
      Author: record.yardName,
      Creator: "Sternpost",
      CreationDate: new Date(record.record.issuedAt),
    },
  });
  doc.registerFont(REGULAR, regular);
  doc.registerFont(BOLD, bold);
  doc.font(REGULAR);

  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (chunk: Buffer) => chunks.push(chunk));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  const photoFiles = await readPhotoFiles(record, options.photoBytes);
  const w = new Writer(doc, options.timeZone);
  const inOrder = { ...record, checklists: inWorkOrder(record.checklists) };
  await cover(w, inOrder, options);
  inOrder.checklists.forEach((checklist, i) =>
    checklistPages(w, checklist, i, inOrder.checklists.length, photoFiles),
  );
  pageFurniture(w, record);
  doc.end();
  return done;
}
