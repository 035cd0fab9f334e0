import type { Unit } from "../../app/lib/calc/units.ts";
import { placedItems, type Item, type Rule, type Template } from "../../app/lib/templates/schema.ts";

/**
 * What a careful technician enters at an item the demo does not spell out: a pass, the first
 * option that is not a finding, and a figure inside the item's acceptance rule (its nominal, the
 * middle of its band, or a comfortable margin from its one limit). Invented, like the rest of the
 * demo; the figures a newcomer should look at (runout, alignment) are written out in demo-story.ts.
 */

export interface Hand {
  by: string;
  initials: string;
  at: () => string;
}

/** A figure inside the rule, rounded to what a gauge shows. */
function inside(rule: Rule | undefined, fallback: number): number {
  if (!rule) return fallback;
  const { min, max, nominal } = rule;
  const raw =
    nominal ??
    (min !== undefined && max !== undefined
      ? (min + max) / 2
      : max !== undefined
        ? max * 0.5
        : min !== undefined
          ? min === 0
            ? 1
            : min * 1.2
          : fallback);
  return Number(raw.toPrecision(3));
}

export function plainEntry(item: Item, hand: Hand): unknown {
  switch (item.kind) {
    case "check":
      return { result: "pass" };
    case "choice": {
      const option = item.options.find((o) => !o.needsNote) ?? item.options[0]!;
      return { option: option.key };
    }
    case "measure": {
      const unit: Unit = item.rule?.unit ?? item.unit;
      return { attempts: [{ value: inside(item.rule, 1), unit, at: hand.at(), by: hand.by }] };
    }
    case "readings": {
      const unit: Unit = item.rule?.unit ?? item.unit;
      const value = inside(item.rule, 0);
      const cells = item.rows.map(() => item.columns.map(() => value));
      return { attempts: [{ cells, unit, at: hand.at(), by: hand.by }] };
    }
    case "text":
      return { text: "Nothing further to note." };
    case "initials":
      return { initials: hand.initials, at: hand.at(), by: hand.by };
    case "photo":
    case "calc":
      return undefined;
  }
}

/**
 * Entries for a checklist: `spelled` entries where given, and a plain entry for every other item
 * `wanted` picks (all when absent). Items that take a fact of the job are left out: the app fills
 * them from the job's equipment when the checklist is started (prefill.server.ts).
 */
export function entriesFor(
  template: Template,
  hand: Hand,
  spelled: Record<string, unknown> = {},
  wanted: (item: Item) => boolean = () => true,
): [string, unknown][] {
  const entries: [string, unknown][] = [];
  for (const { item } of placedItems(template)) {
    if ("fromJob" in item && item.fromJob !== undefined) continue;
    const value = spelled[item.key] ?? (wanted(item) ? plainEntry(item, hand) : undefined);
    if (value !== undefined) entries.push([item.key, value]);
  }
  return entries;
}
