/** Verdicts on paper, in words and a drawn shape (never colour alone), and the tally of a checklist. */
import type { RecordChecklist } from "~/lib/record/types";
import { verdictOnRecord, type RecordShape, type RecordVerdict } from "~/lib/format";
import { evaluate, type Item, type Verdict } from "~/lib/templates";
import { inkSoft, sound, brass, fault } from "./record-pdf-writer.server.ts";

export type Shape = RecordShape;

/** A verdict as the PDF draws it: the record's words and shape, and the shape's colour. */
export interface Reading extends RecordVerdict {
  colour: string;
}

/** How a verdict reads on paper: the record's words (app/lib/format) with the shape drawn in its colour. */
export function readVerdict(item: Item, verdict: Verdict): Reading {
  const reading = verdictOnRecord(item, verdict);
  return { ...reading, colour: toneColours[reading.tone] };
}

const toneColours: Record<RecordVerdict["tone"], string> = {
  sound: sound,
  finding: brass,
  fault: fault,
  quiet: inkSoft,
};

export const shapeLegend: [Shape, string, string][] = [
  ["tick", sound, "within limit, passed or confirmed"],
  ["triangle", brass, "a finding: outside a limit or failed, with the action taken"],
  ["square", inkSoft, "recorded or computed; no limit applies"],
  ["circle", inkSoft, "not answered, or not applicable with the reason"],
  ["cross", fault, "incomplete or not fitting the item"],
];

export const NEEDS_ATTENTION = new Set<Verdict["status"]>(["out-of-range", "needs-note", "invalid"]);

export interface Tally {
  items: number;
  findings: number;
  open: number;
  unanswered: number;
}

export function tally(checklist: RecordChecklist): Tally {
  const responses = valuesOf(checklist);
  const t: Tally = { items: 0, findings: 0, open: 0, unanswered: 0 };
  for (const section of checklist.template.sections) {
    for (const item of section.items) {
      const verdict = evaluate(item, responses[item.key], { template: checklist.template, responses });
      t.items += 1;
      if (verdict.status === "action-noted") t.findings += 1;
      else if (verdict.status === "unanswered") t.unanswered += 1;
      // An optional item left part-done (one photo of two) is not a loose end; a reading outside
      // its limit or a finding without its note is, whether the item is required or not.
      else if (!verdict.done && (item.required || NEEDS_ATTENTION.has(verdict.status))) t.open += 1;
    }
  }
  return t;
}

export function tallyWords(t: Tally): string {
  const parts = [`${t.items} items`, t.findings === 1 ? "1 finding" : `${t.findings} findings`];
  if (t.unanswered) parts.push(`${t.unanswered} not answered`);
  if (t.open) parts.push(`${t.open} unresolved`);
  return parts.join(", ");
}

export function valuesOf(checklist: RecordChecklist): Record<string, unknown> {
  return Object.fromEntries(Object.entries(checklist.responses).map(([key, r]) => [key, r.value]));
}
