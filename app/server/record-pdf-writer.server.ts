/** The record PDF's layout primitives: fonts, page, palette and the Writer that lays text and tables down the page. */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { type Shape } from "./record-pdf-verdicts.server.ts";

export const nodeRequire = createRequire(import.meta.url);

export const FONT_PACKAGE = "@expo-google-fonts/atkinson-hyperlegible";

export const REGULAR = "Atkinson";

// svg-to-pdfkit finds the bold face of a family by this "-Bold" suffix.
export const BOLD = "Atkinson-Bold";

let fontFiles: { regular: Buffer; bold: Buffer } | undefined;

export function fonts() {
  fontFiles ??= {
    regular: readFileSync(
      nodeRequire.resolve(`${FONT_PACKAGE}/400Regular/AtkinsonHyperlegible_400Regular.ttf`),
    ),
    bold: readFileSync(nodeRequire.resolve(`${FONT_PACKAGE}/700Bold/AtkinsonHyperlegible_700Bold.ttf`)),
  };
  return fontFiles;
}

export const MARGIN = { top: 66, bottom: 66, left: 56, right: 56 };

/** Sternpost's palette (app.css): slate ink on white, copper accent, brass for attention. */
export const ink = "#15212c";

export const inkSoft = "#3b4a57";

export const rule = "#c9c2b3";

export const paper = "#f6f3ec";

export const copper = "#9c4221";

export const sound = "#17624f";

export const brass = "#8a6100";

export const fault = "#a4161a";

export const size = { title: 26, vessel: 17, h1: 19, h2: 12.5, label: 10.5, body: 9.5, small: 8, tiny: 7 };

export const TNUM = { features: ["tnum" as const] };

export interface Column {
  label: string;
  width: number;
  align?: "left" | "right" | "center";
}

export interface Cell {
  text: string;
  bold?: boolean;
  colour?: string;
  /** A shape drawn before the text, for a verdict in a table. */
  mark?: { shape: Shape; colour: string };
}

/** Lays text and tables down the page, starting a new page when the next piece does not fit. */
export class Writer {
  readonly doc: PDFKit.PDFDocument;
  readonly left = MARGIN.left;
  readonly width: number;
  /** The running title of each page (the checklist it belongs to), for the header. */
  readonly pageTitles: string[] = [];
  currentTitle = "";
  private readonly hasGlyph: (codePoint: number) => boolean;

  /** The yard's time zone: every moment in the record is written on the yard's clock. */
  readonly timeZone: string;

  constructor(doc: PDFKit.PDFDocument, timeZone = "UTC") {
    this.doc = doc;
    this.timeZone = timeZone;
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

export function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

/** Column widths in proportion, filling `total`. */
export function spread(total: number, weights: number[]): number[] {
  const all = sum(weights);
  return weights.map((w) => (total * w) / all);
}
