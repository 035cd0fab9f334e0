import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import PDFDocument from "pdfkit";
import QRCode from "qrcode";
import { renderToStaticMarkup } from "react-dom/server";
// svg-to-pdfkit ships no type declarations; its one function is typed below (PlaceSvg).
// @ts-expect-error TS7016
import svgToPdfkit from "svg-to-pdfkit";
import { diagramFor } from "~/components/diagrams/for-calc";
import { presentValue } from "~/lib/calc/present";
import type { CalcInput } from "~/lib/calc/registry";
import { convert, type Unit } from "~/lib/calc/units";
import type { CommissioningRecord, RecordChecklist, RecordRevision } from "~/lib/record/types";
import {
  calcDefinition,
  describeRule,
  evaluate,
  findItem,
  formatQuantity,
  gatherCalcInputs,
  liveAttempts,
  phaseLabels,
  strikeOf,
  unitSymbol,
  type CalcItem,
  type CheckValue,
  type ChoiceValue,
  type InitialsValue,
  type Item,
  type MeasureItem,
  type MeasureValue,
  type PhotoValue,
  type ReadingsItem,
  type ReadingsValue,
  type Template,
  type TextValue,
  type Verdict,
} from "~/lib/templates";
import { formatEntered } from "~/lib/templates/format";
import { hullTypeLabels } from "~/lib/validation/vessels";
import { jobScopeLabels } from "~/lib/validation/jobs";

/**
 * The commissioning record as a PDF: a cover with the yard, vessel, job, installed equipment,
 * the record's digest and a QR code of its verification link, then every checklist item by item
 * with its value, verdict (in words and a drawn shape, never colour alone), acceptance rule,
 * every attempt, notes, the lead's comments, photo references (and the photos, scaled, when the
 * caller can read them) and computed results.
 * Fonts are the app's own Atkinson Hyperlegible TTFs, embedded (subset) in the file.
 */

export interface RecordPdfOptions {
  /** The record's SHA-256 (recordDigest), printed on the cover. */
  digest: string;
  /** The public verification page the QR code points at. */
  verifyUrl: string;
  /** Reads a stored photo's bytes by id (photos.server.ts photoBytes); without it photos are listed, not shown. */
  photoBytes?: (id: string) => Promise<Buffer | undefined>;
}

/** The app's statement of what governs, on the cover and at the foot of every page. */
export const GOVERNING_STATEMENT =
  "Sternpost records and computes. The engine maker's installation instructions, the applicable standards and local regulations, and the judgement of a qualified person govern.";

// ---- fonts, page, palette -------------------------------------------------------------------

const nodeRequire = createRequire(import.meta.url);
const FONT_PACKAGE = "@expo-google-fonts/atkinson-hyperlegible";
const REGULAR = "Atkinson";
// svg-to-pdfkit finds the bold face of a family by this "-Bold" suffix.
const BOLD = "Atkinson-Bold";

let fontFiles: { regular: Buffer; bold: Buffer } | undefined;
function fonts() {
  fontFiles ??= {
    regular: readFileSync(
      nodeRequire.resolve(`${FONT_PACKAGE}/400Regular/AtkinsonHyperlegible_400Regular.ttf`),
    ),
    bold: readFileSync(nodeRequire.resolve(`${FONT_PACKAGE}/700Bold/AtkinsonHyperlegible_700Bold.ttf`)),
  };
  return fontFiles;
}

const MARGIN = { top: 66, bottom: 66, left: 56, right: 56 };

/** Sternpost's palette (app.css): slate ink on white, copper accent, brass for attention. */
const ink = "#15212c";
const inkSoft = "#3b4a57";
const rule = "#c9c2b3";
const paper = "#f6f3ec";
const copper = "#9c4221";
const sound = "#17624f";
const brass = "#8a6100";
const fault = "#a4161a";

const size = { title: 26, vessel: 17, h1: 19, h2: 12.5, label: 10.5, body: 9.5, small: 8, tiny: 7 };
const TNUM = { features: ["tnum" as const] };

// ---- words ----------------------------------------------------------------------------------

const dayFormat = new Intl.DateTimeFormat("en-GB", {
  day: "numeric",
  month: "long",
  year: "numeric",
  timeZone: "UTC",
});

/** "12 May 2025": a date no reader can take for another. */
function day(iso: string): string {
  return dayFormat.format(new Date(`${iso.slice(0, 10)}T00:00:00Z`));
}

/** "12 May 2025, 09:14 UTC": every time in the record is in UTC, and says so. */
function when(iso: string): string {
  const t = new Date(iso);
  if (Number.isNaN(t.getTime())) return iso;
  const utc = t.toISOString();
  return `${day(utc)}, ${utc.slice(11, 16)} UTC`;
}

/** A true minus sign: "−0.0005 in" reads as negative at a glance, a hyphen does not. */
function minus(text: string): string {
  return text.replace(/(^|[\s(])-(?=\d)/g, "$1\u2212");
}

const entered = (value: number, unit: Unit) => minus(formatEntered(value, unit));
const quantity = (value: number, unit: Unit) => minus(formatQuantity(value, unit));

function listWords(items: string[]): string {
  return items.length <= 1 ? (items[0] ?? "") : `${items.slice(0, -1).join(", ")} and ${items.at(-1)}`;
}

// ---- verdicts in words and shapes ------------------------------------------------------------

type Shape = "tick" | "triangle" | "circle" | "square" | "cross";

interface Reading {
  shape: Shape;
  colour: string;
  words: string;
  /** What the note is, when the item carries one: "Corrective action", "Reason"… */
  noteLabel: string;
  /** The evaluator's account of what is out ("0.0016 in is above the upper limit of 0.001 in."). */
  detail?: string;
}

/** The evaluator's message without the request it makes of the technician at the item. */
function account(verdict: Verdict): string {
  return verdict.message.replace(/\s*Noted\.$/, "").replace(/\s*Write the corrective action.*$/, "");
}

function hasRule(item: Item): boolean {
  return (item.kind === "measure" || item.kind === "readings") && item.rule !== undefined;
}

/** How a verdict reads on paper. The verdict itself always comes from the one evaluator (rules.ts). */
function readVerdict(item: Item, verdict: Verdict): Reading {
  const detail = account(verdict);
  switch (verdict.status) {
    case "ok": {
      if (item.kind === "check") return { shape: "tick", colour: sound, words: "Passed", noteLabel: "Note" };
      if (item.kind === "initials")
        return { shape: "tick", colour: sound, words: "Confirmed", noteLabel: "Note" };
      if (item.kind === "calc") {
        return verdict.outcome?.verdict === "pass"
          ? { shape: "tick", colour: sound, words: "Within limit", noteLabel: "Note" }
          : { shape: "square", colour: inkSoft, words: "Computed (no limit applies)", noteLabel: "Note" };
      }
      if (hasRule(item)) return { shape: "tick", colour: sound, words: "Within limit", noteLabel: "Note" };
      const words = {
        measure: "Recorded",
        readings: "Recorded",
        choice: "Recorded",
        text: "Written",
        photo: "Photographed",
      } as const;
      return {
        shape: "square",
        colour: inkSoft,
        words: words[item.kind as keyof typeof words] ?? "Recorded",
        noteLabel: "Note",
      };
    }
    case "noted":
    case "action-noted":
      switch (verdict.finding) {
        case "fail":
          return {
            shape: "triangle",
            colour: brass,
            words: "Failed, action recorded",
            noteLabel: "Action taken",
          };
        case "not-applicable":
          return { shape: "circle", colour: inkSoft, words: "Not applicable", noteLabel: "Reason" };
        case "flagged-option":
          return { shape: "triangle", colour: brass, words: "Finding recorded", noteLabel: "Note" };
        default:
          return {
            shape: "triangle",
            colour: brass,
            words: "Outside limit, corrective action recorded",
            noteLabel: "Corrective action",
            detail,
          };
      }
    case "out-of-range":
      return {
        shape: "triangle",
        colour: fault,
        words: "Outside limit, no corrective action recorded",
        noteLabel: "Note",
        detail,
      };
    case "needs-note":
      return { shape: "triangle", colour: fault, words: "Finding without its note", noteLabel: "Note" };
    case "unanswered":
      return {
        shape: "circle",
        colour: inkSoft,
        words: item.required ? "Not answered" : "Not answered (optional)",
        noteLabel: "Note",
      };
    case "incomplete":
      return { shape: "cross", colour: fault, words: "Incomplete", noteLabel: "Note", detail };
    case "invalid":
      return {
        shape: "cross",
        colour: fault,
        words: "Entry does not fit the item",
        noteLabel: "Note",
        detail,
      };
  }
}

const shapeLegend: [Shape, string, string][] = [
  ["tick", sound, "within limit, passed or confirmed"],
  ["triangle", brass, "a finding: outside a limit or failed, with the action taken"],
  ["square", inkSoft, "recorded or computed; no limit applies"],
  ["circle", inkSoft, "not answered, or not applicable with the reason"],
  ["cross", fault, "incomplete or not fitting the item"],
];

// ---- diagrams -------------------------------------------------------------------------------

/**
 * The diagram of a calc item as SVG markup, or undefined when its calculation has none: the same
 * pure SVG components the screens show (app/components/diagrams), rendered to static markup.
 */
function svgForCalc(
  calc: string,
  detail: unknown,
  inputs: Record<string, CalcInput | undefined>,
): string | undefined {
  const element = diagramFor(calc, detail, inputs);
  return element ? renderToStaticMarkup(element) : undefined;
}

type PlaceSvg = (
  doc: PDFKit.PDFDocument,
  svg: string,
  x: number,
  y: number,
  options: {
    width: number;
    height: number;
    preserveAspectRatio?: string;
    fontCallback?: (family: string, bold: boolean, italic: boolean) => string;
  },
) => void;
const placeSvgIn = svgToPdfkit as PlaceSvg;

/** Width ÷ height from the SVG's viewBox (or width and height); square when it gives neither. */
function svgAspect(svg: string): number {
  const box = /viewBox\s*=\s*["']\s*[-\d.]+[\s,]+[-\d.]+[\s,]+([\d.]+)[\s,]+([\d.]+)/.exec(svg);
  if (box && Number(box[2]) > 0) return Number(box[1]) / Number(box[2]);
  const w = /\bwidth\s*=\s*["']([\d.]+)/.exec(svg);
  const h = /\bheight\s*=\s*["']([\d.]+)/.exec(svg);
  return w && h && Number(h[1]) > 0 ? Number(w[1]) / Number(h[1]) : 1;
}

// ---- the page writer ------------------------------------------------------------------------

interface Column {
  label: string;
  width: number;
  align?: "left" | "right" | "center";
}

interface Cell {
  text: string;
  bold?: boolean;
  colour?: string;
  /** A shape drawn before the text, for a verdict in a table. */
  mark?: { shape: Shape; colour: string };
}

/** Lays text and tables down the page, starting a new page when the next piece does not fit. */
class Writer {
  readonly doc: PDFKit.PDFDocument;
  readonly left = MARGIN.left;
  readonly width: number;
  /** The running title of each page (the checklist it belongs to), for the header. */
  readonly pageTitles: string[] = [];
  currentTitle = "";
  private readonly hasGlyph: (codePoint: number) => boolean;

  constructor(doc: PDFKit.PDFDocument) {
    this.doc = doc;
    this.width = doc.page.width - MARGIN.left - MARGIN.right;
    doc.on("pageAdded", () => {
      this.pageTitles.push(this.currentTitle);
      doc.x = MARGIN.left;
      doc.y = MARGIN.top;
    });
    this.pageTitles.push("");
    // fontkit's font behind pdfkit's: pdfkit has no public way to ask whether a glyph exists.
    const font = (doc as unknown as { _font?: { font?: { hasGlyphForCodePoint?: (cp: number) => boolean } } })
      ._font?.font;
    this.hasGlyph = font?.hasGlyphForCodePoint ? (cp) => font.hasGlyphForCodePoint!(cp) : () => true;
  }

  get y(): number {
    return this.doc.y;
  }
  set y(value: number) {
    this.doc.y = value;
  }
  get bottom(): number {
    return this.doc.page.height - MARGIN.bottom;
  }

  /** Text the embedded font can draw: a character it lacks becomes its compatibility form (₂ → 2). */
  printable(text: string): string {
    let out = "";
    for (const ch of text) {
      const cp = ch.codePointAt(0)!;
      if (cp < 0x20 || this.hasGlyph(cp)) {
        out += ch;
        continue;
      }
      const plain = ch.normalize("NFKD");
      out += [...plain].every((c) => this.hasGlyph(c.codePointAt(0)!)) ? plain : ch;
    }
    return out;
  }

  style(font: "regular" | "bold", fontSize: number, colour = ink): this {
    this.doc
      .font(font === "bold" ? BOLD : REGULAR)
      .fontSize(fontSize)
      .fillColor(colour);
    return this;
  }

  newPage(): void {
    this.doc.addPage();
  }

  /** Starts a new page unless `height` more points fit on this one. */
  ensure(height: number): void {
    if (this.y + height > this.bottom) this.newPage();
  }

  height(text: string, width: number, options: PDFKit.Mixins.TextOptions = {}): number {
    return this.doc.heightOfString(this.printable(text), { width, lineGap: 1.5, ...options });
  }

  /**
   * A paragraph at x (from the left margin) in the current style. Short paragraphs move whole to
   * the next page; a long one flows across pages.
   */
  paragraph(text: string, options: { indent?: number; gap?: number; tnum?: boolean } = {}): void {
    const indent = options.indent ?? 0;
    const width = this.width - indent;
    const extra = options.tnum ? TNUM : {};
    const h = this.height(text, width, extra);
    if (this.y + h > this.bottom && h < (this.bottom - MARGIN.top) / 3) this.newPage();
    this.doc.text(this.printable(text), this.left + indent, this.y, { width, lineGap: 1.5, ...extra });
    this.y += options.gap ?? 0;
  }

  /** "Label: value" with the label in bold, wrapped as one paragraph. */
  labelled(
    label: string,
    value: string,
    options: { indent?: number; colour?: string; fontSize?: number } = {},
  ): void {
    const fontSize = options.fontSize ?? size.body;
    const indent = options.indent ?? 0;
    const width = this.width - indent;
    this.style("regular", fontSize);
    const whole = `${label}: ${value}`;
    const h = this.height(whole, width);
    if (this.y + h > this.bottom && h < (this.bottom - MARGIN.top) / 3) this.newPage();
    this.style("bold", fontSize, options.colour ?? ink);
    this.doc.text(this.printable(`${label}: `), this.left + indent, this.y, {
      width,
      lineGap: 1.5,
      continued: true,
    });
    this.style("regular", fontSize, ink);
    this.doc.text(this.printable(value), { width, lineGap: 1.5 });
  }

  rule(colour: string, weight: number): void {
    this.doc
      .save()
      .moveTo(this.left, this.y)
      .lineTo(this.left + this.width, this.y)
      .lineWidth(weight)
      .strokeColor(colour)
      .stroke()
      .restore();
  }

  /** A verdict shape of side `s` with its centre at (cx, cy). */
  shape(kind: Shape, colour: string, cx: number, cy: number, s = 8): void {
    const doc = this.doc;
    const h = s / 2;
    doc.save().lineWidth(1.4).strokeColor(colour).fillColor(colour).lineJoin("round").lineCap("round");
    switch (kind) {
      case "tick":
        doc
          .moveTo(cx - h, cy)
          .lineTo(cx - h * 0.25, cy + h * 0.75)
          .lineTo(cx + h, cy - h * 0.8)
          .stroke();
        break;
      case "triangle":
        doc.polygon([cx, cy - h * 1.05], [cx + h * 1.1, cy + h * 0.9], [cx - h * 1.1, cy + h * 0.9]).fill();
        break;
      case "circle":
        doc.circle(cx, cy, h * 0.85).stroke();
        break;
      case "square":
        doc.rect(cx - h * 0.7, cy - h * 0.7, h * 1.4, h * 1.4).fill();
        break;
      case "cross":
        doc
          .moveTo(cx - h * 0.8, cy - h * 0.8)
          .lineTo(cx + h * 0.8, cy + h * 0.8)
          .stroke();
        doc
          .moveTo(cx + h * 0.8, cy - h * 0.8)
          .lineTo(cx - h * 0.8, cy + h * 0.8)
          .stroke();
        break;
    }
    doc.restore();
  }

  /** A table with a tinted header row, repeated when it runs onto a new page. */
  table(columns: Column[], rows: Cell[][], options: { indent?: number; fontSize?: number } = {}): void {
    const fontSize = options.fontSize ?? size.small + 0.5;
    const x0 = this.left + (options.indent ?? 0);
    const pad = 3.5;
    const markRoom = 11;
    const cellWidth = (c: Column, cell?: Cell) => c.width - 2 * pad - (cell?.mark ? markRoom : 0);
    const headerHeight = () => {
      this.style("bold", size.small);
      return Math.max(...columns.map((c) => this.height(c.label, c.width - 2 * pad))) + 2 * pad;
    };
    const header = () => {
      const h = headerHeight();
      const top = this.y;
      this.doc
        .save()
        .rect(x0, top, sum(columns.map((c) => c.width)), h)
        .fill(paper)
        .restore();
      let x = x0;
      for (const c of columns) {
        this.style("bold", size.small, inkSoft);
        this.doc.text(this.printable(c.label), x + pad, top + pad, {
          width: c.width - 2 * pad,
          align: c.align ?? "left",
          lineGap: 1.5,
        });
        x += c.width;
      }
      this.y = top + h;
      this.hline(x0, columns, ink, 0.6);
    };
    const rowHeight = (row: Cell[]) =>
      Math.max(
        ...row.map((cell, i) => {
          this.style(cell.bold ? "bold" : "regular", fontSize);
          return this.height(cell.text, cellWidth(columns[i], cell), TNUM);
        }),
      ) +
      2 * pad;

    this.ensure(headerHeight() + (rows[0] ? rowHeight(rows[0]) : 0));
    header();
    for (const row of rows) {
      const h = rowHeight(row);
      if (this.y + h > this.bottom) {
        this.newPage();
        header();
      }
      const top = this.y;
      let x = x0;
      row.forEach((cell, i) => {
        const c = columns[i];
        let tx = x + pad;
        if (cell.mark) {
          this.shape(cell.mark.shape, cell.mark.colour, tx + 4, top + pad + fontSize * 0.55, 7);
          tx += markRoom;
        }
        this.style(cell.bold ? "bold" : "regular", fontSize, cell.colour ?? ink);
        this.doc.text(this.printable(cell.text), tx, top + pad, {
          width: cellWidth(c, cell),
          align: c.align ?? "left",
          lineGap: 1.5,
          ...TNUM,
        });
        x += c.width;
      });
      this.y = top + h;
      this.hline(x0, columns, rule, 0.5);
    }
    this.doc.x = this.left;
  }

  private hline(x0: number, columns: Column[], colour: string, weight: number): void {
    const w = sum(columns.map((c) => c.width));
    this.doc
      .save()
      .moveTo(x0, this.y)
      .lineTo(x0 + w, this.y)
      .lineWidth(weight)
      .strokeColor(colour)
      .stroke()
      .restore();
  }
}

function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

/** Column widths in proportion, filling `total`. */
function spread(total: number, weights: number[]): number[] {
  const all = sum(weights);
  return weights.map((w) => (total * w) / all);
}

// ---- the cover ------------------------------------------------------------------------------

const keyWidthIn = (width: number) => Math.min(96, width * 0.34);

/** The height of one key and its value laid side by side. */
function keyValueHeight(w: Writer, width: number, key: string, value: string): number {
  const keyWidth = keyWidthIn(width);
  w.style("regular", size.small + 0.5);
  const keyHeight = w.height(key, keyWidth - 6);
  w.style("regular", size.body);
  return Math.max(keyHeight, w.height(value, width - keyWidth, TNUM));
}

/** Keys in a narrow soft column, values beside them; returns where the last one ends. */
function keyValues(w: Writer, x: number, width: number, pairs: [string, string][]): number {
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

function boxTitle(w: Writer, x: number, width: number, title: string): void {
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

interface Tally {
  items: number;
  findings: number;
  open: number;
  unanswered: number;
}

function tally(checklist: RecordChecklist): Tally {
  const responses = valuesOf(checklist);
  const t: Tally = { items: 0, findings: 0, open: 0, unanswered: 0 };
  for (const section of checklist.template.sections) {
    for (const item of section.items) {
      const verdict = evaluate(item, responses[item.key], { template: checklist.template, responses });
      t.items += 1;
      if (verdict.status === "action-noted") t.findings += 1;
      else if (verdict.status === "unanswered") t.unanswered += 1;
      else if (!verdict.done) t.open += 1;
    }
  }
  return t;
}

function tallyWords(t: Tally): string {
  const parts = [`${t.items} items`, t.findings === 1 ? "1 finding" : `${t.findings} findings`];
  if (t.unanswered) parts.push(`${t.unanswered} not answered`);
  if (t.open) parts.push(`${t.open} unresolved`);
  return parts.join(", ");
}

async function cover(w: Writer, record: CommissioningRecord, options: RecordPdfOptions): Promise<void> {
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
      `${jobScopeLabels[job.scope]} · job ${job.id} · issued ${when(record.record.issuedAt)} · record ${record.record.id}`,
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
      { text: c.countersignedAt ? when(c.countersignedAt) : "" },
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

async function verification(w: Writer, { digest, verifyUrl }: RecordPdfOptions): Promise<void> {
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

// ---- checklists -----------------------------------------------------------------------------

function valuesOf(checklist: RecordChecklist): Record<string, unknown> {
  return Object.fromEntries(Object.entries(checklist.responses).map(([key, r]) => [key, r.value]));
}

function checklistHeader(w: Writer, checklist: RecordChecklist, index: number, count: number): void {
  const { doc } = w;
  const t = checklist.template;
  w.style("bold", size.small + 0.5, copper);
  doc.text(`CHECKLIST ${index + 1} OF ${count}`, w.left, w.y);
  w.y += 2;
  w.style("bold", size.h1, ink);
  w.paragraph(t.title);
  w.style("regular", size.body, inkSoft);
  w.paragraph(`Template ${checklist.templateKey}, version ${checklist.templateVersion}`, {
    tnum: true,
    gap: 4,
  });
  w.style("regular", size.body, ink);
  w.paragraph(t.purpose, { gap: 8 });

  const pairs: [string, string][] = [
    [
      "Submitted",
      checklist.submittedBy
        ? `${checklist.submittedBy}, ${checklist.submittedAt ? when(checklist.submittedAt) : "time not recorded"}`
        : "not submitted",
    ],
    [
      "Countersigned",
      checklist.countersignedBy
        ? `${checklist.countersignedBy}, ${checklist.countersignedAt ? when(checklist.countersignedAt) : "time not recorded"}`
        : "not countersigned",
    ],
    ["Checklist digest (SHA-256)", checklist.digest || "none stored"],
    ["In this checklist", tallyWords(tally(checklist))],
  ];
  const pad = 9;
  const inner = w.width - 2 * pad;
  const height = sum(pairs.map(([k, v]) => keyValueHeight(w, inner, k, v) + 3)) - 3 + 2 * pad;
  w.ensure(height);
  const top = w.y;
  doc.save().rect(w.left, top, w.width, height).fill(paper).restore();
  w.y = top + pad;
  keyValues(w, w.left + pad, inner, pairs);
  w.y = top + height + 14;
  doc.x = w.left;
}

function sectionHeading(w: Writer, index: number, title: string, firstItemNeeds: number): void {
  w.ensure(36 + firstItemNeeds);
  w.y += 6;
  w.style("bold", size.h2, ink);
  w.doc.text(w.printable(`${index + 1}   ${title}`), w.left, w.y, { width: w.width });
  w.y += 2;
  w.rule(ink, 1);
  w.y += 8;
}

const GUTTER = 30;

/** What every item of one checklist is rendered against. */
interface ChecklistContext {
  checklist: RecordChecklist;
  responses: Record<string, unknown>;
  /** "2.3" by item key, for cross-references. */
  numbers: Map<string, string>;
  photoFiles: PhotoFiles;
}

function itemBlock(w: Writer, ctx: ChecklistContext, item: Item): void {
  const { doc } = w;
  const { checklist, responses } = ctx;
  const number = ctx.numbers.get(item.key) ?? "";
  const response = checklist.responses[item.key];
  const verdict = evaluate(item, response?.value, { template: checklist.template, responses });
  const reading = readVerdict(item, verdict);
  const x = w.left + GUTTER;
  const width = w.width - GUTTER;

  w.ensure(itemNeeds(w, ctx, item));
  const top = w.y;
  w.style("regular", size.small + 0.5, inkSoft);
  doc.text(number, w.left, top + 1.5, { width: GUTTER - 4, ...TNUM });
  w.style("bold", size.label, ink);
  doc.text(w.printable(item.label), x, top, { width, lineGap: 1.5 });
  w.y += 2;

  // The verdict line: shape, words, and the rule it was judged by.
  const verdictTop = w.y;
  w.shape(reading.shape, reading.colour, x + 4.5, verdictTop + 5.5, 8.5);
  const ruleText = ruleOf(item, verdict);
  w.style("bold", size.body, reading.colour);
  doc.text(w.printable(reading.words), x + 14, verdictTop, {
    width: width - 14,
    continued: ruleText !== undefined,
    lineGap: 1.5,
  });
  if (ruleText !== undefined) {
    w.style("regular", size.body, inkSoft);
    doc.text(w.printable(`   Rule: ${ruleText}`), { lineGap: 1.5, ...TNUM });
  }
  const meta = [
    item.phase ? phaseLabels[item.phase] : undefined,
    item.required ? undefined : "optional",
    item.reference ? `Reference: ${item.reference}` : undefined,
  ].filter((part): part is string => part !== undefined);
  if (meta.length) {
    w.style("regular", size.small, inkSoft);
    doc.text(w.printable(meta.join(" · ")), x, w.y + 1, { width, lineGap: 1 });
  }
  w.y += 4;

  const indent = GUTTER;
  if (reading.detail) {
    w.style("regular", size.body, ink);
    w.paragraph(reading.detail, { indent, tnum: true, gap: 2 });
  }

  itemValue(w, ctx, item, response?.value, verdict, indent);

  const note = noteOf(response?.value);
  if (note)
    w.labelled(reading.noteLabel, note, {
      indent,
      colour: reading.shape === "triangle" ? reading.colour : ink,
    });

  if (response) {
    w.style("regular", size.small, inkSoft);
    w.paragraph(`Entered by ${response.by}, ${when(response.at)} (revision ${response.rev})`, {
      indent,
      tnum: true,
    });
    earlierEntries(w, item, checklist.history[item.key] ?? [], response.rev, indent);
  }

  const photos = photoReferences(checklist, item, response?.value);
  if (photos.length) {
    w.y += 3;
    const widths = spread(w.width - indent, [36, 66]);
    w.table(
      [
        { label: photos.length === 1 ? "Photo" : `Photos (${photos.length})`, width: widths[0] },
        { label: "SHA-256 of the stored file", width: widths[1] },
      ],
      photos.map((photo) => [
        { text: photo.id },
        { text: photo.sha256 ?? "not yet recorded", colour: photo.sha256 ? ink : inkSoft },
      ]),
      { indent, fontSize: 7.2 },
    );
    w.y += 2;
    photoPictures(w, photos, ctx.photoFiles, indent);
  }

  const comments = checklist.comments
    .filter((c) => c.itemKey === item.key)
    .sort((a, b) => (a.at < b.at ? -1 : 1));
  for (const comment of comments) {
    w.y += 2;
    w.labelled(`Review comment, ${comment.by}, ${when(comment.at)}`, comment.text, {
      indent,
      colour: copper,
      fontSize: size.small + 0.5,
    });
  }

  w.y += 9;
  w.doc
    .save()
    .moveTo(x, w.y - 4.5)
    .lineTo(w.left + w.width, w.y - 4.5)
    .lineWidth(0.4)
    .strokeColor(rule)
    .stroke()
    .restore();
}

/** Room for an item's heading and the first of its content, so a heading never ends a page alone. */
function itemNeeds(w: Writer, ctx: ChecklistContext, item: Item): number {
  const width = w.width - GUTTER;
  const verdict = evaluate(item, ctx.responses[item.key], {
    template: ctx.checklist.template,
    responses: ctx.responses,
  });
  w.style("bold", size.label);
  return w.height(item.label, width) + 44 + leadIn(w, item, readVerdict(item, verdict), width);
}

function leadIn(w: Writer, item: Item, reading: Reading, width: number): number {
  w.style("regular", size.body);
  const detail = reading.detail ? w.height(reading.detail, width) : 0;
  switch (item.kind) {
    case "measure":
      return detail + 44;
    case "readings":
      return detail + 70;
    case "calc": {
      const definition = calcDefinition(item.calc);
      w.style("regular", size.small);
      return (
        detail +
        (definition
          ? w.height(`${definition.title}: ${definition.summary} Source: ${definition.source}.`, width)
          : 0) +
        60
      );
    }
    default:
      return detail;
  }
}

function ruleOf(item: Item, verdict: Verdict): string | undefined {
  if ((item.kind === "measure" || item.kind === "readings") && item.rule) return describeRule(item.rule);
  if (item.kind === "calc" && verdict.outcome && verdict.outcome.verdict !== "info")
    return verdict.outcome.rule;
  return undefined;
}

function noteOf(value: unknown): string | undefined {
  const note =
    value && typeof value === "object" && "note" in value ? (value as { note?: unknown }).note : undefined;
  return typeof note === "string" && note.trim() ? note.trim() : undefined;
}

/** An entry in a few words, for the list of earlier entries. */
function valueWords(item: Item, value: unknown): string {
  switch (item.kind) {
    case "check": {
      const v = value as CheckValue;
      return { pass: "Passed", fail: "Failed", na: "Not applicable" }[v.result] ?? String(v.result);
    }
    case "choice": {
      const v = value as ChoiceValue;
      return item.options.find((o) => o.key === v.option)?.label ?? v.option;
    }
    case "text":
      return (value as TextValue).text;
    case "initials":
      return `initials ${(value as InitialsValue).initials}`;
    case "photo": {
      const n = (value as PhotoValue).photos?.length ?? 0;
      return n === 1 ? "1 photo" : `${n} photos`;
    }
    default:
      return "";
  }
}

/** Earlier revisions of items without attempts (a check that first failed, a changed choice). */
function earlierEntries(
  w: Writer,
  item: Item,
  history: RecordRevision[],
  currentRev: number,
  indent: number,
): void {
  if (item.kind === "measure" || item.kind === "readings" || item.kind === "calc") return;
  const earlier = history.filter((r) => r.rev < currentRev).sort((a, b) => a.rev - b.rev);
  for (const revision of earlier) {
    const note = noteOf(revision.value);
    const words = [valueWords(item, revision.value), note ? `note: ${note}` : undefined]
      .filter(Boolean)
      .join("; ");
    w.style("regular", size.small, inkSoft);
    w.paragraph(`Earlier, revision ${revision.rev}: ${words} (${revision.by}, ${when(revision.at)})`, {
      indent,
      tnum: true,
    });
  }
}

function photoReferences(
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
type PhotoFiles = Map<string, Buffer | "differs">;

/** Every photo the record refers to, read once before the pages are laid out. */
async function readPhotoFiles(
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

const PICTURE = { width: 140, height: 105, gap: 8, caption: 12 };

/** The item's photos, scaled into a grid of boxes under their table, in the table's order. */
function photoPictures(w: Writer, photos: { id: string }[], files: PhotoFiles, indent: number): void {
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

function itemValue(
  w: Writer,
  ctx: ChecklistContext,
  item: Item,
  value: unknown,
  verdict: Verdict,
  indent: number,
): void {
  if (value === undefined && item.kind !== "calc") return;
  switch (item.kind) {
    case "measure":
      return measureAttempts(w, item, value as MeasureValue, indent);
    case "readings":
      return readingsAttempts(w, item, value as ReadingsValue, indent);
    case "calc":
      return calcResult(w, ctx, item, verdict, indent);
    case "choice":
      w.style("regular", size.body, ink);
      w.labelled("Chosen", valueWords(item, value), { indent });
      return;
    case "text":
      w.style("regular", size.body, ink);
      w.paragraph(`“${(value as TextValue).text}”`, { indent });
      return;
    case "initials": {
      const v = value as InitialsValue;
      w.labelled("Initials", `${v.initials}, ${v.by}, ${when(v.at)}`, { indent });
      return;
    }
    default:
      return;
  }
}

function attemptMark(item: MeasureItem | ReadingsItem, verdict: Verdict): Cell["mark"] {
  if (!item.rule) return undefined;
  if (verdict.status === "ok") return { shape: "tick", colour: sound };
  if (verdict.status === "out-of-range") return { shape: "triangle", colour: brass };
  return undefined;
}

/** A struck attempt stays in the record, marked with who struck it, when and why (docs/sync-merge-rules.md). */
function struck(value: MeasureValue | ReadingsValue, attempt: { id?: string }): string {
  const strike = strikeOf(value, attempt);
  return strike ? ` · STRUCK THROUGH by ${strike.by}, ${when(strike.at)}: ${strike.reason}` : "";
}

function measureAttempts(w: Writer, item: MeasureItem, value: MeasureValue, indent: number): void {
  const attempts = value.attempts ?? [];
  const ruleUnit = item.rule?.unit;
  const converted = ruleUnit !== undefined && attempts.some((a) => a.unit !== ruleUnit);
  const width = w.width - indent;
  const weights = converted ? [1.5, 2, 2, 2.6, 3.2] : [1.5, 2.4, 3, 3.6];
  const widths = spread(width, weights);
  const columns: Column[] = [
    { label: "Attempt", width: widths[0] },
    { label: "Value", width: widths[1] },
    ...(converted ? [{ label: `Converted to ${unitSymbol(ruleUnit!)}`, width: widths[2] }] : []),
    { label: "By", width: widths[converted ? 3 : 2] },
    { label: "When", width: widths[converted ? 4 : 3] },
  ];
  const rows = attempts.map((attempt, i): Cell[] => {
    const last = attempt === liveAttempts(value).at(-1);
    const own = evaluate(item, { attempts: [attempt] });
    return [
      { text: (last ? `${i + 1} (reported)` : String(i + 1)) + struck(value, attempt), bold: last },
      { text: entered(attempt.value, attempt.unit), bold: last, mark: attemptMark(item, own) },
      ...(converted ? [{ text: quantity(convert(attempt.value, attempt.unit, ruleUnit!), ruleUnit!) }] : []),
      { text: attempt.by },
      { text: when(attempt.at) },
    ];
  });
  w.table(columns, rows, { indent });
  w.y += 4;
}

function readingsAttempts(w: Writer, item: ReadingsItem, value: ReadingsValue, indent: number): void {
  const attempts = value.attempts ?? [];
  const width = w.width - indent;
  const labelWidth = Math.min(170, width * 0.34);
  const cellWidth = (width - labelWidth) / item.columns.length;
  attempts.forEach((attempt, i) => {
    const last = attempt === liveAttempts(value).at(-1);
    const own = evaluate(item, { attempts: [attempt] });
    const offending = own.offending ?? [];
    const caption = `Attempt ${i + 1} of ${attempts.length}${last ? " (reported)" : ""} · values in ${unitSymbol(attempt.unit)} · ${attempt.by}, ${when(attempt.at)}${struck(value, attempt)}`;
    w.style(last ? "bold" : "regular", size.small + 0.5, last ? ink : inkSoft);
    w.ensure(w.height(caption, width) + 40);
    w.paragraph(caption, { indent, tnum: true, gap: 2 });
    const columns: Column[] = [
      { label: "", width: labelWidth },
      ...item.columns.map((c) => ({ label: c.label, width: cellWidth, align: "right" as const })),
    ];
    const rows = item.rows.map((row, r): Cell[] => {
      const wholeRow = offending.some((o) => o.row === r && o.column === undefined);
      return [
        { text: row.label, mark: wholeRow ? { shape: "triangle", colour: brass } : undefined },
        ...item.columns.map((_, c): Cell => {
          const cell = attempt.cells[r]?.[c];
          const out = offending.some((o) => o.row === r && o.column === c);
          return {
            text: cell === null || cell === undefined ? "not read" : minus(String(cell)),
            bold: out,
            colour: cell === null || cell === undefined ? inkSoft : out ? brass : ink,
            mark: out ? { shape: "triangle", colour: brass } : undefined,
          };
        }),
      ];
    });
    w.table(columns, rows, { indent });
    if (item.rule && own.status !== "incomplete") {
      const words = own.status === "ok" ? "Within the rule." : account(own);
      w.style("regular", size.small, own.status === "ok" ? sound : brass);
      w.paragraph(words, { indent, tnum: true });
    }
    w.y += 5;
  });
}

function calcResult(
  w: Writer,
  ctx: ChecklistContext,
  item: CalcItem,
  verdict: Verdict,
  indent: number,
): void {
  const { checklist } = ctx;
  const definition = calcDefinition(item.calc);
  const outcome = verdict.outcome;
  const width = w.width - indent;
  const about = definition ? `${definition.title}: ${definition.summary} Source: ${definition.source}.` : "";
  if (!outcome || !definition) {
    if (about) {
      w.style("regular", size.small, inkSoft);
      w.paragraph(about, { indent, gap: 2 });
    }
    return;
  }

  const labels = keyLabels(checklist.template, item);
  const rows = Object.entries(outcome.values).map(([name, v]): Cell[] => {
    const unit = outcome.units[name];
    const text = typeof v === "number" ? minus(presentValue(name, v, unit).text) : (labels.get(v) ?? v);
    return [{ text: name }, { text, bold: true }];
  });
  // The description, the table's head and its first rows stay on one page.
  w.style("regular", size.small, inkSoft);
  w.ensure(w.height(about, width) + 24 + 18 * Math.min(rows.length, 3));
  w.paragraph(about, { indent, gap: 2 });
  const widths = spread(Math.min(width, 330), [3, 2.2]);
  w.table(
    [
      { label: "Result", width: widths[0] },
      { label: "Value", width: widths[1], align: "right" },
    ],
    rows,
    { indent },
  );

  // What the calculation was given: the items it read and the constants the template set.
  const from = Object.entries(item.inputs).map(([name, binding]) => {
    const spec = definition.inputs[name];
    const label = spec?.label ?? name;
    if ("item" in binding) {
      const source = findItem(checklist.template, binding.item);
      return `${label}, item ${ctx.numbers.get(binding.item) ?? binding.item} “${source?.label ?? binding.item}”`;
    }
    const unit = spec?.unit;
    const v = binding.value;
    const shown =
      typeof v === "number" ? (unit ? quantity(v, unit) : String(v)) : Array.isArray(v) ? v.join(", ") : v;
    return `${label}, ${shown} (set by the template)`;
  });
  w.y += 3;
  w.style("regular", size.small, inkSoft);
  w.paragraph(`Inputs: ${from.join("; ")}.`, { indent, tnum: true, gap: 2 });

  const gathered = gatherCalcInputs(item, definition, checklist.template, ctx.responses);
  const svg = gathered.ready ? svgForCalc(item.calc, outcome.detail, gathered.inputs) : undefined;
  if (svg) placeSvg(w, svg, indent, Math.min(width, 360));
}

/** Labels for the row and column keys a calculation reports ("middle" → "Mid-length"). */
function keyLabels(template: Template, item: CalcItem): Map<string, string> {
  const labels = new Map<string, string>();
  for (const binding of Object.values(item.inputs)) {
    if (!("item" in binding)) continue;
    const source = findItem(template, binding.item);
    if (source?.kind !== "readings") continue;
    for (const line of [...source.rows, ...source.columns]) labels.set(line.key, line.label);
  }
  return labels;
}

/** The root element's own width and height would fix its size in pixels; without them it fills its box. */
function scalable(svg: string): string {
  return svg.replace(/^<svg\b[^>]*>/, (root) => root.replace(/\s(?:width|height)="[^"]*"/g, ""));
}

/** Places SVG markup at the left of the content, `width` wide, with the app's fonts. */
function placeSvg(w: Writer, svg: string, indent: number, width: number): void {
  const height = Math.min(width / svgAspect(svg), 260);
  w.ensure(height + 8);
  placeSvgIn(w.doc, scalable(svg), w.left + indent, w.y + 4, {
    width,
    height,
    preserveAspectRatio: "xMinYMin meet",
    fontCallback: (_family, bold) => (bold ? BOLD : REGULAR),
  });
  w.y += height + 8;
  w.doc.x = w.left;
}

function checklistPages(
  w: Writer,
  checklist: RecordChecklist,
  index: number,
  count: number,
  photoFiles: PhotoFiles,
): void {
  w.currentTitle = `${index + 1}. ${checklist.template.title}`;
  w.newPage();
  checklistHeader(w, checklist, index, count);
  const numbers = new Map<string, string>();
  checklist.template.sections.forEach((section, s) =>
    section.items.forEach((item, i) => numbers.set(item.key, `${s + 1}.${i + 1}`)),
  );
  const ctx: ChecklistContext = { checklist, responses: valuesOf(checklist), numbers, photoFiles };
  checklist.template.sections.forEach((section, s) => {
    sectionHeading(w, s, section.title, itemNeeds(w, ctx, section.items[0]));
    section.items.forEach((item) => itemBlock(w, ctx, item));
  });
}

// ---- running header and footer ---------------------------------------------------------------

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

// ---- the document ---------------------------------------------------------------------------

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
  const w = new Writer(doc);
  await cover(w, record, options);
  record.checklists.forEach((checklist, i) =>
    checklistPages(w, checklist, i, record.checklists.length, photoFiles),
  );
  pageFurniture(w, record);
  doc.end();
  return done;
}
