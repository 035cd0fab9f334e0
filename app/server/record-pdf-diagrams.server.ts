/** The app's SVG diagrams, drawn into the record PDF with its own fonts. */
import { renderToStaticMarkup } from "react-dom/server";
// svg-to-pdfkit ships no type declarations; its one function is typed below (PlaceSvg).
// @ts-expect-error TS7016
import svgToPdfkit from "svg-to-pdfkit";
import { diagramFor } from "~/components/diagrams/for-calc";
import type { CalcInput } from "~/lib/calc/registry";
import { REGULAR, BOLD, Writer } from "./record-pdf-writer.server.ts";

/**
 * The diagram of a calc item as SVG markup, or undefined when its calculation has none: the same
 * pure SVG components the screens show (app/components/diagrams), rendered to static markup.
 */
export function svgForCalc(
  calc: string,
  detail: unknown,
  inputs: Record<string, CalcInput | undefined>,
): string | undefined {
  const element = diagramFor(calc, detail, inputs);
  return element ? renderToStaticMarkup(element) : undefined;
}

export type PlaceSvg = (
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

export const placeSvgIn = svgToPdfkit as PlaceSvg;

/** Width ÷ height from the SVG's viewBox (or width and height); square when it gives neither. */
export function svgAspect(svg: string): number {
  const box = /viewBox\s*=\s*["']\s*[-\d.]+[\s,]+[-\d.]+[\s,]+([\d.]+)[\s,]+([\d.]+)/.exec(svg);
  if (box && Number(box[2]) > 0) return Number(box[1]) / Number(box[2]);
  const w = /\bwidth\s*=\s*["']([\d.]+)/.exec(svg);
  const h = /\bheight\s*=\s*["']([\d.]+)/.exec(svg);
  return w && h && Number(h[1]) > 0 ? Number(w[1]) / Number(h[1]) : 1;
}

/** The root element's own width and height would fix its size in pixels; without them it fills its box. */
export function scalable(svg: string): string {
  return svg.replace(/^<svg\b[^>]*>/, (root) => root.replace(/\s(?:width|height)="[^"]*"/g, ""));
}

/** Places SVG markup at the left of the content, `width` wide, with the app's fonts. */
export function placeSvg(w: Writer, svg: string, indent: number, width: number): void {
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
