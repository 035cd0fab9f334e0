/** Verdicts on paper, in words and a drawn shape (never colour alone), and the tally of a checklist. */
import type { RecordChecklist } from "~/lib/record/types";
import { evaluate, type Item, type Verdict } from "~/lib/templates";
import { inkSoft, sound, brass, fault } from "./record-pdf-writer.server.ts";

export type Shape = "tick" | "triangle" | "circle" | "square" | "cross";

export interface Reading {
  shape: Shape;
  colour: string;
  words: string;
  /** What the note is, when the item carries one: "Corrective action", "Reason"… */
  noteLabel: string;
  /** The evaluator's account of what is out ("0.0016 in is above the upper limit of 0.001 in."). */
  detail?: string;
}

export function hasRule(item: Item): boolean {
  return (item.kind === "measure" || item.kind === "readings") && item.rule !== undefined;
}

/** How a verdict reads on paper. The verdict itself always comes from the one evaluator (rules.ts). */
export function readVerdict(item: Item, verdict: Verdict): Reading {
  // A finding's own account (rules.ts keeps it apart from what it asks of the technician).
  const detail = verdict.account ?? verdict.message;
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
