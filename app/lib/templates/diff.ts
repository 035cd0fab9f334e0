import { sameJson } from "~/lib/sync/protocol";
import type { Item, Section, Template } from "./schema";

/**
 * What changed between two versions of a template, item by item. Items and sections are matched
 * by key (keys are what responses and calc bindings hang on), so a renamed label is a change and
 * a new key is a new item. An item counts as moved when it changed section, or when its order
 * among the items its section kept changed; a section moved is reported once, not as every one
 * of its items.
 */

export interface FieldChange {
  /** `label`, `rule.max`, `inputs.gaps`...: one level below the item, lists compared whole. */
  field: string;
  /** undefined when the field was not set. */
  before: unknown;
  after: unknown;
}

export interface ItemPlace {
  sectionKey: string;
  sectionTitle: string;
  /** 1-based position in its section. */
  position: number;
}

export type ChangeStatus = "added" | "removed" | "kept";

export interface ItemChange {
  key: string;
  label: string;
  kind: Item["kind"];
  status: ChangeStatus;
  from?: ItemPlace;
  to?: ItemPlace;
  moved: boolean;
  fields: FieldChange[];
  /** The item as it is now (as it was, when removed): what an added item asks for, the unit of a changed limit. */
  item: Item;
}

export interface SectionChange {
  key: string;
  title: string;
  status: ChangeStatus;
  moved: boolean;
  fields: FieldChange[];
}

export interface TemplateDiff {
  from: { key: string; version: number };
  to: { key: string; version: number };
  /** title and purpose */
  fields: FieldChange[];
  /** Every section, in the newer order, a removed one after the section it followed. */
  sections: SectionChange[];
  /** Only the items that changed, in reading order, a removed one after the item it followed. */
  items: ItemChange[];
  counts: { added: number; removed: number; moved: number; changed: number };
  /** Nothing differs but the version number. */
  same: boolean;
}

export function diffTemplates(from: Template, to: Template): TemplateDiff {
  const fields = [
    ...changedFields("title", from.title, to.title),
    ...changedFields("purpose", from.purpose, to.purpose),
  ];
  const sections = diffSections(from.sections, to.sections);
  const items = diffItems(from, to).filter((c) => c.status !== "kept" || c.moved || c.fields.length > 0);
  const counts = {
    added: items.filter((c) => c.status === "added").length,
    removed: items.filter((c) => c.status === "removed").length,
    moved: items.filter((c) => c.moved).length,
    changed: items.filter((c) => c.fields.length > 0).length,
  };
  const sectionsSame = sections.every((s) => s.status === "kept" && !s.moved && s.fields.length === 0);
  return {
    from: { key: from.key, version: from.version },
    to: { key: to.key, version: to.version },
    fields,
    sections,
    items,
    counts,
    same: fields.length === 0 && sectionsSame && items.length === 0,
  };
}

function diffSections(from: Section[], to: Section[]): SectionChange[] {
  const before = new Map(from.map((s) => [s.key, s]));
  const after = new Set(to.map((s) => s.key));
  const keptOrder = new Set(
    inOrder(
      from.map((s) => s.key).filter((k) => after.has(k)),
      to.map((s) => s.key).filter((k) => before.has(k)),
    ),
  );
  const entries = to.map((section): SectionChange => {
    const old = before.get(section.key);
    if (!old) return { key: section.key, title: section.title, status: "added", moved: false, fields: [] };
    return {
      key: section.key,
      title: section.title,
      status: "kept",
      moved: !keptOrder.has(section.key),
      fields: changedFields("title", old.title, section.title),
    };
  });
  const removed = from
    .filter((s) => !after.has(s.key))
    .map((s): SectionChange & { anchor?: string } => ({
      key: s.key,
      title: s.title,
      status: "removed",
      moved: false,
      fields: [],
      anchor: precedingKept(
        from.map((x) => x.key),
        s.key,
        after,
      ),
    }));
  return interleave(entries, removed);
}

interface Placed {
  item: Item;
  section: Section;
  place: ItemPlace;
}

function placesOf(template: Template): Map<string, Placed> {
  const map = new Map<string, Placed>();
  for (const section of template.sections) {
    section.items.forEach((item, i) => {
      if (!map.has(item.key))
        map.set(item.key, {
          item,
          section,
          place: { sectionKey: section.key, sectionTitle: section.title, position: i + 1 },
        });
    });
  }
  return map;
}

function diffItems(from: Template, to: Template): ItemChange[] {
  const before = placesOf(from);
  const after = placesOf(to);

  // Within each section both versions have, the items it kept keep their order unless moved.
  const inPlace = new Set<string>();
  for (const section of to.sections) {
    const old = from.sections.find((s) => s.key === section.key);
    if (!old) continue;
    const stayed = (key: string) =>
      before.get(key)?.section.key === section.key && after.get(key)?.section.key === section.key;
    const oldOrder = old.items.map((i) => i.key).filter(stayed);
    const newOrder = section.items.map((i) => i.key).filter(stayed);
    for (const key of inOrder(oldOrder, newOrder)) inPlace.add(key);
  }

  const entries = [...after.values()].map(({ item, place }): ItemChange => {
    const old = before.get(item.key);
    if (!old)
      return {
        key: item.key,
        label: item.label,
        kind: item.kind,
        status: "added",
        to: place,
        moved: false,
        fields: [],
        item,
      };
    return {
      key: item.key,
      label: item.label,
      kind: item.kind,
      status: "kept",
      from: old.place,
      to: place,
      moved: !inPlace.has(item.key),
      fields: itemFieldChanges(old.item, item),
      item,
    };
  });
  const fromKeys = [...before.keys()];
  const removed = [...before.values()]
    .filter(({ item }) => !after.has(item.key))
    .map(({ item, place }): ItemChange & { anchor?: string } => ({
      key: item.key,
      label: item.label,
      kind: item.kind,
      status: "removed",
      from: place,
      moved: false,
      fields: [],
      item,
      anchor: precedingKept(fromKeys, item.key, new Set(after.keys())),
    }));
  return interleave(entries, removed);
}

function itemFieldChanges(before: Item, after: Item): FieldChange[] {
  const changes: FieldChange[] = [];
  const a = before as unknown as Record<string, unknown>;
  const b = after as unknown as Record<string, unknown>;
  for (const field of unionKeys(b, a)) {
    if (field === "key") continue;
    if (isPlainObject(a[field]) && isPlainObject(b[field])) {
      const x = a[field] as Record<string, unknown>;
      const y = b[field] as Record<string, unknown>;
      for (const sub of unionKeys(y, x)) changes.push(...changedFields(`${field}.${sub}`, x[sub], y[sub]));
    } else {
      changes.push(...changedFields(field, a[field], b[field]));
    }
  }
  return changes;
}

function changedFields(field: string, before: unknown, after: unknown): FieldChange[] {
  return sameJson(before, after) ? [] : [{ field, before, after }];
}

/** Keys of the newer object first, in its order, then those only the older one has. */
function unionKeys(newer: Record<string, unknown>, older: Record<string, unknown>): string[] {
  return [...new Set([...Object.keys(newer), ...Object.keys(older)])];
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

/**
 * The keys that kept their relative order: a longest common subsequence of two orderings of
 * the same keys. What is left out is what moved — the fewest moves that explain the new order.
 */
export function inOrder(before: readonly string[], after: readonly string[]): string[] {
  const n = before.length;
  const m = after.length;
  const table: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      table[i][j] =
        before[i] === after[j] ? table[i + 1][j + 1] + 1 : Math.max(table[i + 1][j], table[i][j + 1]);
    }
  }
  const kept: string[] = [];
  let i = 0;
  let j = 0;
  while (i < n && j < m) {
    if (before[i] === after[j]) {
      kept.push(before[i]);
      i++;
      j++;
    } else if (table[i + 1][j] >= table[i][j + 1]) i++;
    else j++;
  }
  return kept;
}

/** The nearest key before `key` in the old order that the new version still has. */
function precedingKept(order: readonly string[], key: string, stillThere: Set<string>): string | undefined {
  for (let i = order.indexOf(key) - 1; i >= 0; i--) if (stillThere.has(order[i])) return order[i];
  return undefined;
}

/** Places each removed entry right after the entry it followed in the older version (every kept entry is listed here). */
function interleave<T extends { key: string }>(entries: T[], removed: (T & { anchor?: string })[]): T[] {
  const byAnchor = (anchor: string | undefined) =>
    removed.filter((r) => r.anchor === anchor).map(({ anchor: _, ...rest }) => rest as unknown as T);
  return [...byAnchor(undefined), ...entries.flatMap((entry) => [entry, ...byAnchor(entry.key)])];
}
