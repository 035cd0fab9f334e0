import type { ReactElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { expect } from "vitest";

/** The SVG as the PDF record will get it, with the checks every diagram must pass. */
export function render(element: ReactElement): string {
  const svg = renderToStaticMarkup(element);
  expect(svg.startsWith("<svg")).toBe(true);
  expect(svg).toMatch(/<title>[^<]+<\/title>/);
  expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  // Plain SVG only: svg-to-pdfkit draws neither HTML nor CSS classes.
  expect(svg).not.toMatch(/foreignObject|class=|style=/);
  return svg;
}

/** The text of the <title>, with entities decoded. */
export function titleOf(svg: string): string {
  return decode(/<title>([^<]*)<\/title>/.exec(svg)![1]);
}

/** Every text element's words, decoded, in drawing order (a halo's copy included). */
export function texts(svg: string): string[] {
  return [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => decode(m[1]));
}

/** The attributes of every element with this tag, as numbers where they are numbers. */
export function elements(svg: string, tag: string): Record<string, string>[] {
  return [...svg.matchAll(new RegExp(`<${tag}\\s([^>]*?)/?>`, "g"))].map((m) =>
    Object.fromEntries([...m[1].matchAll(/([\w-]+)="([^"]*)"/g)].map((a) => [a[1], a[2]])),
  );
}

function decode(text: string): string {
  return text
    .replace(/&#x27;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&amp;/g, "&");
}
