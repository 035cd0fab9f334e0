import type { Calculations } from "~/lib/calc/define";
import { evaluateAllWith, type Verdict } from "./rules";
import type { Template } from "./schema";
import type { Responses } from "./values";

/**
 * How far a checklist has got: required items done and left, per section and overall, and the
 * items that want attention (out of range, a missing note, an entry that does not fit) whether
 * required or not. An item is done when its verdict is `ok` or `noted`.
 */

export interface Tally {
  required: number;
  done: number;
  /** Keys of required items not done yet, in reading order. */
  left: string[];
  /** Keys of items whose verdict asks for something: out-of-range, needs-note, invalid. */
  attention: string[];
}

export interface SectionProgress extends Tally {
  key: string;
  title: string;
}

export interface Progress {
  sections: SectionProgress[];
  overall: Tally;
  /** Every required item is done and nothing asks for attention: ready to submit. */
  complete: boolean;
  verdicts: Record<string, Verdict>;
}

const ATTENTION = new Set(["out-of-range", "needs-note", "invalid"]);

export function progressWith(calculations: Calculations, template: Template, responses: Responses): Progress {
  const verdicts = evaluateAllWith(calculations, template, responses);
  const sections = template.sections.map((section): SectionProgress => {
    const tally: Tally = { required: 0, done: 0, left: [], attention: [] };
    for (const item of section.items) {
      const v = verdicts[item.key];
      if (ATTENTION.has(v.status)) tally.attention.push(item.key);
      if (!item.required) continue;
      tally.required += 1;
      if (v.done) tally.done += 1;
      else tally.left.push(item.key);
    }
    return { key: section.key, title: section.title, ...tally };
  });
  const overall: Tally = {
    required: sections.reduce((n, s) => n + s.required, 0),
    done: sections.reduce((n, s) => n + s.done, 0),
    left: sections.flatMap((s) => s.left),
    attention: sections.flatMap((s) => s.attention),
  };
  return {
    sections,
    overall,
    complete: overall.left.length === 0 && overall.attention.length === 0,
    verdicts,
  };
}
