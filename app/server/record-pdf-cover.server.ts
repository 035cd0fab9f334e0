/** The record PDF's cover: yard, vessel, job and equipment, the checklists, and the digest with its QR code. */
import QRCode from "qrcode";
import type { CommissioningRecord } from "~/lib/record/types";
import { hullTypeLabels } from "~/lib/validation/vessels";
import { jobScopeLabels } from "~/lib/validation/jobs";
import {
  MARGIN,
  ink,
  inkSoft,
  rule,
  paper,
  copper,
  fault,
  size,
  TNUM,
  Writer,
  spread,
} from "./record-pdf-writer.server.ts";
import { GOVERNING_STATEMENT, day, when, listWords } from "./record-pdf-words.server.ts";
import { shapeLegend, tally, tallyWords } from "./record-pdf-verdicts.server.ts";

export interface RecordPdfOptions {
  /** The record's SHA-256 (recordDigest), printed on the cover. */
  digest: string;
  /** The public verification page the QR code points at. */
  verifyUrl: string;
  /** Reads a stored photo's bytes by id (photos.server.ts photoBytes); without it photos are listed, not shown. */
  photoBytes?: (id: string) => Promise<Buffer | undefined>;
  /** The yard's time zone (IANA); moments are written on the yard's clock, naming the zone. UTC if absent. */
  timeZone?: string;
}

export const keyWidthIn = (width: number) => Math.min(96, width * 0.34);

/** The height of one key and its value laid side by side. */
export function keyValueHeight(w: Writer, width: number, key: string, value: string): number {
  const keyWidth = keyWidthIn(width);
  w.style("regular", size.small + 0.5);
  const keyHeight = w.height(key, keyWidth - 6);
  w.style("regular", size.body);
  return Math.max(keyHeight, w.height(value, width - keyWidth, TNUM));
}

/** Keys in a narrow soft column, values beside them; returns where the last one ends. */
export function keyValues(w: Writer, x: number, width: number, pairs: [string, string][]): number {
  const keyWidth = keyWidthIn(width);
  let y = w.y;
  for (const [key, value] of pairs) {
    const h = keyValueHeight(w, width, key, value);
    w.style("regular", size.small + 0.5, inkSoft);
    w.doc.text(w.printable(key), x, y + 1, { width: keyWidth - 6, lineGap: 1.5 });
    w.style("regular", size.body, ink);
    w.doc.text(w.printable(value), x + keyWidth, y, { width: width - keyWidth, lineGap: 1.5, ...TNUM });
    y += h + 3;
  }
  return y;
}

export function boxTitle(w: Writer, x: number, width: number, title: string): void {
  w.style("bold", size.small, copper);
  w.doc.text(w.printable(title.toUpperCase()), x, w.y, { width });
  const y = w.y + 2;
  w.doc
    .save()
    .moveTo(x, y)
    .lineTo(x + width, y)
    .lineWidth(0.75)
    .strokeColor(copper)
    .stroke()
    .restore();
  w.y = y + 6;
}

export async function cover(
  w: Writer,
  record: CommissioningRecord,
  options: RecordPdfOptions,
): Promise<void> {
  const { doc } = w;
  const { vessel, job } = record;
  w.y = MARGIN.top - 10;
  w.style("bold", size.label + 0.5, copper);
  doc.text(w.printable(record.yardName), w.left, w.y);
  w.y += 2;
  w.style("bold", size.title, ink);
  doc.text("Commissioning record", w.left, w.y);
  w.style("regular", size.vessel, ink);
  doc.text(w.printable(vessel.name), w.left, w.y);
  w.y += 4;
  w.style("regular", size.body, inkSoft);
  doc.text(
    w.printable(
      `${jobScopeLabels[job.scope]} · job ${job.id} · issued ${when(record.record.issuedAt, w.timeZone)} · record ${record.record.id}`,
    ),
    w.left,
    w.y,
    TNUM,
  );
  w.y += 10;
  w.rule(ink, 1.2);
  w.y += 14;

  const gap = 24;
  const half = (w.width - gap) / 2;
  const top = w.y;
  boxTitle(w, w.left, half, "Vessel");
  const leftEnd = keyValues(w, w.left, half, [
    ["Name", vessel.name],
    ["Hull number (HIN)", vessel.hin ?? "none recorded"],
    ["Length", `${vessel.lengthValue} ${vessel.lengthUnit}`],
    ["Hull type", hullTypeLabels[vessel.hullType]],
    ["Owner", vessel.ownerName],
  ]);
  w.y = top;
  boxTitle(w, w.left + half + gap, half, "Job");
  const rightEnd = keyValues(w, w.left + half + gap, half, [
    ["Job number", String(job.id)],
    ["Scope", jobScopeLabels[job.scope]],
    [
      "Dates",
      `${job.startDate ? `started ${day(job.startDate)}` : "start not recorded"}${job.dueDate ? `, due ${day(job.dueDate)}` : ""}`,
    ],
    ["Lead", job.leadName],
    ["Technicians", job.technicianNames.length ? listWords(job.technicianNames) : "none recorded"],
  ]);
  w.y = Math.max(leftEnd, rightEnd) + 12;

  const equipmentTop = w.y;
  boxTitle(w, w.left, w.width, "Installed equipment");
  const below = w.y;
  const eqLeft = keyValues(w, w.left, half, [
    ["Engine", job.engineModel],
    ["Serial number", job.engineSerial],
    ["Rated power", `${job.ratedPowerHp} hp`],
    ["Rated rpm band", `${job.ratedRpmMin}–${job.ratedRpmMax} rpm`],
    ["Reduction gear", `${job.gearRatio} : 1`],
  ]);
  w.y = below;
  const eqRight = keyValues(w, w.left + half + gap, half, [
    [
      "Propeller",
      `${job.propDiameterIn} in diameter × ${job.propPitchIn} in pitch, ${job.propBlades} blades`,
    ],
    ["Shaft", `${job.shaftDiameterIn} in, ${job.shaftMaterial}`],
    ["Coupling", job.couplingType],
  ]);
  w.y = Math.max(eqLeft, eqRight, equipmentTop) + 12;

  boxTitle(w, w.left, w.width, "Checklists in this record");
  const widths = spread(w.width, [4.2, 1.3, 2.9, 3.3, 2.8]);
  w.table(
    [
      { label: "Checklist", width: widths[0] },
      { label: "Version", width: widths[1] },
      { label: "Countersigned by", width: widths[2] },
      { label: "Countersigned", width: widths[3] },
      { label: "Items", width: widths[4] },
    ],
    record.checklists.map((c, i) => [
      { text: `${i + 1}. ${c.template.title}`, bold: true },
      { text: String(c.templateVersion) },
      { text: c.countersignedBy ?? "not countersigned", colour: c.countersignedBy ? ink : fault },
      { text: c.countersignedAt ? when(c.countersignedAt, w.timeZone) : "" },
      { text: tallyWords(tally(c)) },
    ]),
  );
  w.y += 8;

  // How the verdicts are drawn, so nobody has to guess what a shape means.
  w.style("bold", size.small, inkSoft);
  doc.text("Verdicts are given in words and a shape:", w.left, w.y);
  const legendTop = w.y + 2;
  const legendWidth = w.width / 2;
  shapeLegend.forEach(([shape, colour, words], i) => {
    const x = w.left + (i % 2) * legendWidth;
    const y = legendTop + Math.floor(i / 2) * 12;
    w.shape(shape, colour, x + 4, y + 4.5, 7);
    w.style("regular", size.small, ink);
    doc.text(w.printable(words), x + 13, y, { width: legendWidth - 16, lineBreak: false });
  });
  w.y = legendTop + Math.ceil(shapeLegend.length / 2) * 12 + 10;

  await verification(w, options);

  w.y += 10;
  w.style("regular", size.small + 0.5, inkSoft);
  w.paragraph(GOVERNING_STATEMENT);
}

export async function verification(w: Writer, { digest, verifyUrl }: RecordPdfOptions): Promise<void> {
  const { doc } = w;
  const qrSize = 104;
  const pad = 10;
  const textX = w.left + pad + qrSize + 14;
  const textWidth = w.left + w.width - pad - textX;
  const explanation =
    "The verification page recomputes this digest from the stored record and says whether the record is genuine and unchanged since its checklists were countersigned and it was issued. Every checklist carries its own digest too.";
  w.style("regular", size.small + 0.5);
  const textHeight = 14 + 13 + 12 + w.height(verifyUrl, textWidth) + 6 + w.height(explanation, textWidth);
  const boxHeight = Math.max(qrSize, textHeight) + 2 * pad;
  w.ensure(boxHeight);
  const top = w.y;
  doc.save().rect(w.left, top, w.width, boxHeight).fill(paper).restore();
  doc.save().rect(w.left, top, w.width, boxHeight).lineWidth(0.75).strokeColor(rule).stroke().restore();

  const qr = await QRCode.toDataURL(verifyUrl, {
    errorCorrectionLevel: "M",
    margin: 1,
    width: 480,
    color: { dark: ink, light: "#ffffff" },
  });
  doc.image(qr, w.left + pad, top + pad, { width: qrSize, height: qrSize });

  let y = top + pad;
  w.style("bold", size.small, copper);
  doc.text("RECORD DIGEST (SHA-256)", textX, y, { width: textWidth });
  y += 13;
  // One unbroken line, so it can be read out, compared and searched for whole.
  w.style("bold", 9.5, ink);
  const fitted = Math.min(9.5, (9.5 * textWidth) / doc.widthOfString(digest, TNUM));
  w.style("bold", fitted, ink);
  doc.text(digest, textX, y, { width: textWidth + 1, lineBreak: false, ...TNUM });
  y += 16;
  w.style("bold", size.small, inkSoft);
  doc.text("Check it at", textX, y, { width: textWidth });
  y += 10;
  w.style("regular", size.small + 0.5, ink);
  doc.text(w.printable(verifyUrl), textX, y, { width: textWidth, link: verifyUrl, underline: false });
  y = doc.y + 6;
  w.style("regular", size.small + 0.5, inkSoft);
  doc.text(explanation, textX, y, { width: textWidth, lineGap: 1.5 });
  w.y = top + boxHeight;
  doc.x = w.left;
}
