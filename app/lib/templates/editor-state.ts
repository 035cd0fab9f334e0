import { dimensionOf, isUnit, units, type Unit } from "~/lib/calc/units";
import { readDecimal } from "~/lib/read-number";
import { sameJson } from "~/lib/sync/protocol";
import { calcBindingProblems, calcDefinition } from "./calc-bindings";
import { parseTemplate, type TemplateParse, type TemplateProblem } from "./load";
import { formatPath } from "./path";
import type { AppliesWhen, CalcBinding, CalcItem, Item, ItemKind, JobFact, Phase, Template } from "./schema";

/**
 * The template editor's state and every change the manager can make to it, as a pure reducer.
 * The state holds what is being typed (numbers as text, empty optional fields as ""), so a
 * half-typed draft is representable; `toTemplateInput` turns it into the format and
 * `checkDraft` runs the library's one schema over it, whose problems carry the same paths the
 * editor's fields are named by (`sections[2].items[4].rule.max`).
 */

export type Id = string;

export interface LineDraft {
  id: Id;
  key: string;
  label: string;
  /** The key follows the label until someone types a key of their own. */
  autoKey: boolean;
}

export interface OptionDraft extends LineDraft {
  /** Left unset unless someone sets it, so a file's explicit false comes back as written. */
  needsNote?: boolean;
}

export interface RuleDraft {
  min: string;
  max: string;
  nominal: string;
  tolerance: string;
  unit: string;
  /** Readings items only. */
  appliesTo: "each-cell" | "row-spread";
  /** Calc items only: the value of the result the rule is on. */
  output: string;
}

/** A constant is typed as text and written as the kind of value its input takes. */
export type ConstantKind = "number" | "numbers" | "text";
export type BindingDraft = { from: "item"; item: string } | { from: "value"; text: string; as: ConstantKind };

/** One item of any kind; only the fields of its kind are written out. */
export interface ItemDraft {
  id: Id;
  kind: ItemKind;
  key: string;
  autoKey: boolean;
  label: string;
  hint: string;
  caution: string;
  reference: string;
  required: boolean;
  phase: Phase | "";
  /** Kept as the file has it (the editor does not change it yet). */
  appliesWhen: AppliesWhen | null;
  /** measure and choice: the job's fact it is filled from; kept as the file has it. */
  fromJob: JobFact | "";
  /** measure and readings */
  unit: string;
  accepts: string[] | null;
  rule: RuleDraft | null;
  /** readings */
  rows: LineDraft[];
  columns: LineDraft[];
  /** calc */
  calc: string;
  inputs: Record<string, BindingDraft>;
  /** choice */
  options: OptionDraft[];
  /** photo */
  minPhotos: string;
}

export interface SectionDraft {
  id: Id;
  key: string;
  autoKey: boolean;
  title: string;
  items: ItemDraft[];
}

export interface EditorState {
  key: string;
  version: number;
  title: string;
  purpose: string;
  sections: SectionDraft[];
  nextId: number;
  /** What the last add created, so the screen can open it and put the cursor in it. */
  lastAdded: Id | null;
}

export type LineList = "rows" | "columns" | "options";
export type ItemPatch = Partial<
  Pick<ItemDraft, "key" | "label" | "hint" | "caution" | "reference" | "required" | "phase" | "minPhotos">
>;

export type EditorAction =
  | { type: "template/set"; field: "title" | "purpose"; value: string }
  | { type: "section/add" }
  | { type: "section/update"; id: Id; patch: { key?: string; title?: string } }
  | { type: "section/step"; id: Id; by: -1 | 1 }
  | { type: "section/remove"; id: Id }
  | { type: "item/add"; sectionId: Id; kind: ItemKind }
  | { type: "item/update"; id: Id; patch: ItemPatch }
  | { type: "item/unit"; id: Id; unit: string }
  | { type: "item/accept"; id: Id; unit: string; accepted: boolean }
  | { type: "item/rule"; id: Id; patch: Partial<RuleDraft> | null }
  /** `index` is the slot the item is dropped on as the section shows it now, the item still in place. */
  | { type: "item/move"; id: Id; sectionId: Id; index: number }
  /** One place up or down; past the end of a section it goes into the next one. */
  | { type: "item/step"; id: Id; by: -1 | 1 }
  | { type: "item/remove"; id: Id }
  | { type: "line/add"; itemId: Id; list: LineList }
  | {
      type: "line/update";
      itemId: Id;
      list: LineList;
      lineId: Id;
      patch: { key?: string; label?: string; needsNote?: boolean };
    }
  | { type: "line/step"; itemId: Id; list: LineList; lineId: Id; by: -1 | 1 }
  | { type: "line/remove"; itemId: Id; list: LineList; lineId: Id }
  | { type: "calc/set"; id: Id; calc: string }
  | { type: "calc/bind"; id: Id; input: string; binding: BindingDraft | null };

// ---- keys ----------------------------------------------------------------------------------

/** A key in the format's style (lower-case words joined by hyphens) from a label. */
export function slugKey(text: string, max = 48): string {
  const slug = text
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "");
  if (slug.length <= max) return slug;
  const cut = slug.slice(0, max);
  const lastBreak = cut.lastIndexOf("-");
  return lastBreak > max / 4 ? cut.slice(0, lastBreak) : cut;
}

export function uniqueKey(base: string, taken: Iterable<string>): string {
  const used = new Set(taken);
  if (!used.has(base)) return base;
  for (let n = 2; ; n++) if (!used.has(`${base}-${n}`)) return `${base}-${n}`;
}

// ---- from and to the format ----------------------------------------------------------------

const text = (value: number | undefined) => (value === undefined ? "" : String(value));

function ruleDraft(rule: {
  min?: number;
  max?: number;
  nominal?: number;
  tolerance?: number;
  unit: string;
  appliesTo?: RuleDraft["appliesTo"];
  output?: string;
}): RuleDraft {
  return {
    min: text(rule.min),
    max: text(rule.max),
    nominal: text(rule.nominal),
    tolerance: text(rule.tolerance),
    unit: rule.unit,
    appliesTo: rule.appliesTo ?? "each-cell",
    output: rule.output ?? "",
  };
}

function bindingDraft(binding: CalcBinding): BindingDraft {
  if ("item" in binding) return { from: "item", item: binding.item };
  const value = binding.value;
  if (typeof value === "number") return { from: "value", text: String(value), as: "number" };
  if (typeof value === "string") return { from: "value", text: value, as: "text" };
  return { from: "value", text: value.join(", "), as: "numbers" };
}

function blankItem(id: Id, kind: ItemKind, key: string, autoKey: boolean): ItemDraft {
  return {
    id,
    kind,
    key,
    autoKey,
    label: "",
    hint: "",
    caution: "",
    reference: "",
    required: true,
    phase: "",
    appliesWhen: null,
    fromJob: "",
    unit: "",
    accepts: null,
    rule: null,
    rows: [],
    columns: [],
    calc: "",
    inputs: {},
    options: [],
    minPhotos: "",
  };
}

/** The editor's state for a template read from the library. */
export function fromTemplate(template: Template): EditorState {
  let next = 1;
  const id = (prefix: string) => `${prefix}${next++}`;
  const line = (l: { key: string; label: string }): LineDraft => ({
    id: id("l"),
    key: l.key,
    label: l.label,
    autoKey: false,
  });
  const sections = template.sections.map((section): SectionDraft => ({
    id: id("s"),
    key: section.key,
    autoKey: false,
    title: section.title,
    items: section.items.map((item): ItemDraft => {
      const draft: ItemDraft = {
        ...blankItem(id("i"), item.kind, item.key, false),
        label: item.label,
        hint: item.hint ?? "",
        caution: item.caution ?? "",
        reference: item.reference ?? "",
        required: item.required,
        phase: item.phase ?? "",
        appliesWhen: item.appliesWhen ? structuredClone(item.appliesWhen) : null,
      };
      switch (item.kind) {
        case "measure":
          return {
            ...draft,
            fromJob: item.fromJob ?? "",
            unit: item.unit,
            accepts: item.accepts ? [...item.accepts] : null,
            rule: item.rule ? ruleDraft(item.rule) : null,
          };
        case "readings":
          return {
            ...draft,
            unit: item.unit,
            accepts: item.accepts ? [...item.accepts] : null,
            rule: item.rule ? ruleDraft(item.rule) : null,
            rows: item.rows.map(line),
            columns: item.columns.map(line),
          };
        case "calc":
          return {
            ...draft,
            calc: item.calc,
            inputs: Object.fromEntries(Object.entries(item.inputs).map(([k, b]) => [k, bindingDraft(b)])),
            rule: item.rule ? ruleDraft(item.rule) : null,
          };
        case "choice":
          return {
            ...draft,
            fromJob: item.fromJob ?? "",
            options: item.options.map((o) => ({ ...line(o), needsNote: o.needsNote })),
          };
        case "photo":
          return { ...draft, minPhotos: String(item.minPhotos) };
        default:
          return draft;
      }
    }),
  }));
  return {
    key: template.key,
    version: template.version,
    title: template.title,
    purpose: template.purpose,
    sections,
    nextId: next,
    lastAdded: null,
  };
}

/** A number as typed: "" is unset, "0,5" is 0.5; anything else stays text for the schema to refuse. */
export function numberFrom(typed: string): number | string | undefined {
  const value = readDecimal(typed);
  return value === null ? undefined : value === "invalid" ? typed.trim() : value;
}

const optionalText = (value: string) => (value.trim() ? value : undefined);

function constantValue(binding: Extract<BindingDraft, { from: "value" }>): number | number[] | string {
  if (binding.as === "text") return binding.text;
  if (binding.as === "number") {
    const value = numberFrom(binding.text);
    return typeof value === "number" ? value : binding.text;
  }
  const values = binding.text
    .split(/[\s,;]+/)
    .filter(Boolean)
    .map(numberFrom);
  // Written as text when not all numbers, so the binding check says a list of numbers is expected.
  return values.length && values.every((v) => typeof v === "number") ? (values as number[]) : binding.text;
}

function ruleInput(rule: RuleDraft, kind: ItemKind) {
  return {
    min: numberFrom(rule.min),
    max: numberFrom(rule.max),
    nominal: numberFrom(rule.nominal),
    tolerance: numberFrom(rule.tolerance),
    unit: rule.unit,
    ...(kind === "readings" ? { appliesTo: rule.appliesTo } : {}),
    ...(kind === "calc" ? { output: rule.output } : {}),
  };
}

/** One item in the format (undefined fields are left out when it is written as JSON). */
export function toItemInput(item: ItemDraft): Record<string, unknown> {
  const base = {
    kind: item.kind,
    key: item.key,
    label: item.label,
    hint: optionalText(item.hint),
    caution: optionalText(item.caution),
    reference: optionalText(item.reference),
    required: item.required,
    phase: item.phase || undefined,
    appliesWhen: item.appliesWhen ?? undefined,
  };
  const fromJob = item.fromJob || undefined;
  const line = (l: LineDraft) => ({ key: l.key, label: l.label });
  switch (item.kind) {
    case "measure":
      return {
        ...base,
        fromJob,
        unit: item.unit,
        accepts: item.accepts ?? undefined,
        rule: item.rule ? ruleInput(item.rule, item.kind) : undefined,
      };
    case "readings":
      return {
        ...base,
        rows: item.rows.map(line),
        columns: item.columns.map(line),
        unit: item.unit,
        accepts: item.accepts ?? undefined,
        rule: item.rule ? ruleInput(item.rule, item.kind) : undefined,
      };
    case "calc":
      return {
        ...base,
        calc: item.calc,
        inputs: Object.fromEntries(
          Object.entries(item.inputs).map(([name, b]) => [
            name,
            b.from === "item" ? { item: b.item } : { value: constantValue(b) },
          ]),
        ),
        rule: item.rule ? ruleInput(item.rule, item.kind) : undefined,
      };
    case "choice":
      return { ...base, fromJob, options: item.options.map((o) => ({ ...line(o), needsNote: o.needsNote })) };
    case "photo":
      return { ...base, minPhotos: numberFrom(item.minPhotos) };
    default:
      return base;
  }
}

/** The draft in the template format, ready for the schema (and, once it passes, for saving). */
export function toTemplateInput(state: EditorState) {
  const input = {
    key: state.key,
    version: state.version,
    title: state.title,
    purpose: state.purpose,
    sections: state.sections.map((s) => ({ key: s.key, title: s.title, items: s.items.map(toItemInput) })),
  };
  // Through JSON, as the server receives it: unset fields disappear.
  return JSON.parse(JSON.stringify(input)) as unknown;
}

/** The library's one schema, cross-checks included, over the draft as it stands. */
export function checkDraft(state: EditorState): TemplateParse {
  return parseTemplate(toTemplateInput(state));
}

/** True when the draft, read by the schema, is the template (ids, spacing and typing aside). */
export function sameAsTemplate(state: EditorState, template: Template): boolean {
  const parsed = checkDraft(state);
  return parsed.ok && sameJson(parsed.template, template);
}

// ---- problems at fields --------------------------------------------------------------------

export function problemsByPath(problems: readonly TemplateProblem[]): Map<string, string[]> {
  const map = new Map<string, string[]>();
  for (const p of problems) map.set(p.path, [...(map.get(p.path) ?? []), p.message]);
  return map;
}

/** The path the schema gives a field of a section (`sections[1].title`). */
export function sectionPath(sectionIndex: number, ...rest: (string | number)[]): string {
  return formatPath(["sections", sectionIndex, ...rest]);
}

/** The path the schema gives a field of an item (`sections[1].items[3].rule.min`). */
export function itemPath(sectionIndex: number, itemIndex: number, ...rest: (string | number)[]): string {
  return formatPath(["sections", sectionIndex, "items", itemIndex, ...rest]);
}

/** How many problems lie at or under a path (an item's badge counts its fields' problems too). */
export function problemsUnder(problems: readonly TemplateProblem[], path: string): number {
  return problems.filter(
    (p) => p.path === path || p.path.startsWith(`${path}.`) || p.path.startsWith(`${path}[`),
  ).length;
}

// ---- lookups the screen needs ---------------------------------------------------------------

export function locate(
  state: EditorState,
  itemId: Id,
): { sectionIndex: number; itemIndex: number } | undefined {
  for (let s = 0; s < state.sections.length; s++) {
    const i = state.sections[s].items.findIndex((item) => item.id === itemId);
    if (i >= 0) return { sectionIndex: s, itemIndex: i };
  }
  return undefined;
}

export function allItems(state: EditorState): ItemDraft[] {
  return state.sections.flatMap((s) => s.items);
}

/** Units of the same dimension as `unit` (what an item may also accept, what its rule may be in). */
export function unitsLike(unit: string): Unit[] {
  if (!isUnit(unit)) return [];
  return units.filter((u) => dimensionOf(u) === dimensionOf(unit));
}

/**
 * The template's items that can feed a calculation's input, by the library's own binding check:
 * the right kind, and a unit of the right dimension.
 */
export function itemsThatFit(state: EditorState, calcItemId: Id, calc: string, input: string): ItemDraft[] {
  if (!calcDefinition(calc)) return [];
  return allItems(state).filter((candidate) => candidate.id !== calcItemId && fits(candidate, calc, input));
}

function fits(candidate: ItemDraft, calc: string, input: string): boolean {
  const probe = {
    kind: "calc",
    key: `${candidate.key}-probe`,
    label: "probe",
    required: true,
    calc,
    inputs: { [input]: { item: candidate.key } },
  } as CalcItem;
  const template = {
    sections: [{ key: "probe", title: "probe", items: [toItemInput(candidate) as Item, probe] }],
  } as unknown as Template;
  try {
    return !calcBindingProblems(probe, template).some((p) => p.path[0] === "inputs" && p.path[1] === input);
  } catch {
    return false; // an item whose unit is not known yet fits nothing
  }
}

/** How a constant for this input is written: the first kind of value it takes that a constant can be. */
export function constantKindFor(accepts: readonly string[]): ConstantKind | undefined {
  return (["number", "numbers", "text"] as const).find((kind) => accepts.includes(kind));
}

// ---- the reducer ---------------------------------------------------------------------------

const lineBase: Record<LineList, string> = { rows: "row", columns: "column", options: "option" };

function otherItemKeys(state: EditorState, exceptId: Id): string[] {
  return allItems(state)
    .filter((i) => i.id !== exceptId)
    .map((i) => i.key);
}

function mapItems(state: EditorState, fn: (item: ItemDraft) => ItemDraft): EditorState {
  return { ...state, sections: state.sections.map((s) => ({ ...s, items: s.items.map(fn) })) };
}

function updateItem(state: EditorState, id: Id, fn: (item: ItemDraft) => ItemDraft): EditorState {
  return mapItems(state, (item) => (item.id === id ? fn(item) : item));
}

function findDraft(state: EditorState, id: Id): ItemDraft | undefined {
  return allItems(state).find((i) => i.id === id);
}

/** A calc bound to an item follows that item's key when it is renamed (if the old key was its alone). */
function renameItemKey(state: EditorState, id: Id, key: string): EditorState {
  const item = findDraft(state, id);
  if (!item || item.key === key) return state;
  const oldKey = item.key;
  const wasUnique = allItems(state).filter((i) => i.key === oldKey).length === 1;
  return mapItems(state, (other) => {
    if (other.id === id) return { ...other, key };
    if (!wasUnique) return other;
    if (other.appliesWhen?.item === oldKey)
      other = { ...other, appliesWhen: { ...other.appliesWhen, item: key } };
    if (other.kind !== "calc") return other;
    const inputs = Object.fromEntries(
      Object.entries(other.inputs).map(([name, b]) => [
        name,
        b.from === "item" && b.item === oldKey ? { ...b, item: key } : b,
      ]),
    );
    return { ...other, inputs };
  });
}

function moveWithin<T>(list: readonly T[], from: number, to: number): T[] {
  if (from === to || to < 0 || to >= list.length) return [...list];
  const copy = [...list];
  const [moved] = copy.splice(from, 1);
  copy.splice(to, 0, moved);
  return copy;
}

function newItem(state: EditorState, kind: ItemKind): { item: ItemDraft; nextId: number } {
  let next = state.nextId;
  const id = `i${next++}`;
  const key = uniqueKey(
    kind,
    allItems(state).map((i) => i.key),
  );
  const item = blankItem(id, kind, key, true);
  const line = (list: LineList, n: number, label: string): LineDraft => ({
    id: `l${next++}`,
    key: `${lineBase[list]}-${n}`,
    label,
    autoKey: true,
  });
  switch (kind) {
    case "measure":
      return { item: { ...item, unit: "in" }, nextId: next };
    case "readings":
      return {
        item: {
          ...item,
          unit: "in",
          rows: [line("rows", 1, "Row 1")],
          columns: [line("columns", 1, "Column 1")],
        },
        nextId: next,
      };
    case "choice":
      return { item: { ...item, options: [line("options", 1, ""), line("options", 2, "")] }, nextId: next };
    case "photo":
      return { item: { ...item, minPhotos: "1" }, nextId: next };
    default:
      return { item, nextId: next };
  }
}

function step<T extends { id: Id }>(list: readonly T[], id: Id, by: -1 | 1): T[] {
  const i = list.findIndex((x) => x.id === id);
  return i < 0 ? [...list] : moveWithin(list, i, i + by);
}

function lineReducer(
  item: ItemDraft,
  action: Extract<EditorAction, { type: `line/${string}` }>,
  nextId: number,
): ItemDraft {
  const list = item[action.list] as LineDraft[];
  const set = (lines: LineDraft[]) => ({ ...item, [action.list]: lines });
  switch (action.type) {
    case "line/add": {
      const key = uniqueKey(
        `${lineBase[action.list]}-${list.length + 1}`,
        list.map((l) => l.key),
      );
      const line: LineDraft = { id: `l${nextId}`, key, label: "", autoKey: true };
      return set([...list, line]);
    }
    case "line/update":
      return set(
        list.map((line) => {
          if (line.id !== action.lineId) return line;
          const { key, label, needsNote } = action.patch;
          const changed = {
            ...line,
            ...(label !== undefined ? { label } : {}),
            ...(needsNote !== undefined ? { needsNote } : {}),
          };
          if (key !== undefined) return { ...changed, key, autoKey: false };
          if (label !== undefined && line.autoKey) {
            const base = slugKey(label) || `${lineBase[action.list]}-${list.indexOf(line) + 1}`;
            return {
              ...changed,
              key: uniqueKey(
                base,
                list.filter((l) => l.id !== line.id).map((l) => l.key),
              ),
            };
          }
          return changed;
        }),
      );
    case "line/step":
      return set(step(list, action.lineId, action.by));
    case "line/remove":
      return set(list.filter((l) => l.id !== action.lineId));
  }
}

export function editorReducer(state: EditorState, action: EditorAction): EditorState {
  switch (action.type) {
    case "template/set":
      return { ...state, [action.field]: action.value };

    case "section/add": {
      const id = `s${state.nextId}`;
      const key = uniqueKey(
        "section",
        state.sections.map((s) => s.key),
      );
      return {
        ...state,
        sections: [...state.sections, { id, key, autoKey: true, title: "", items: [] }],
        nextId: state.nextId + 1,
        lastAdded: id,
      };
    }
    case "section/update":
      return {
        ...state,
        sections: state.sections.map((s) => {
          if (s.id !== action.id) return s;
          const { key, title } = action.patch;
          if (key !== undefined)
            return { ...s, key, autoKey: false, ...(title !== undefined ? { title } : {}) };
          if (title === undefined) return s;
          const taken = state.sections.filter((o) => o.id !== s.id).map((o) => o.key);
          return { ...s, title, key: s.autoKey ? uniqueKey(slugKey(title) || "section", taken) : s.key };
        }),
      };
    case "section/step":
      return { ...state, sections: step(state.sections, action.id, action.by) };
    case "section/remove":
      return { ...state, sections: state.sections.filter((s) => s.id !== action.id) };

    case "item/add": {
      if (!state.sections.some((s) => s.id === action.sectionId)) return state;
      const { item, nextId } = newItem(state, action.kind);
      return {
        ...state,
        sections: state.sections.map((s) =>
          s.id === action.sectionId ? { ...s, items: [...s.items, item] } : s,
        ),
        nextId,
        lastAdded: item.id,
      };
    }
    case "item/update": {
      const item = findDraft(state, action.id);
      if (!item) return state;
      const { key, ...rest } = action.patch;
      let next = updateItem(state, action.id, (i) => ({ ...i, ...rest }));
      if (key !== undefined) {
        next = renameItemKey(next, action.id, key);
        next = updateItem(next, action.id, (i) => ({ ...i, autoKey: false }));
      } else if (rest.label !== undefined && item.autoKey) {
        next = renameItemKey(
          next,
          action.id,
          uniqueKey(slugKey(rest.label) || item.kind, otherItemKeys(state, action.id)),
        );
      }
      return next;
    }
    case "item/unit":
      return updateItem(state, action.id, (item) => {
        const like = unitsLike(action.unit);
        const accepts = item.accepts && [
          action.unit,
          ...item.accepts.filter((u) => u !== action.unit && (like as string[]).includes(u)),
        ];
        // A rule in another dimension means nothing any more: it follows the item's unit.
        const rule =
          item.rule && !(like as string[]).includes(item.rule.unit)
            ? { ...item.rule, unit: action.unit }
            : item.rule;
        return { ...item, unit: action.unit, accepts: accepts && accepts.length > 1 ? accepts : null, rule };
      });
    case "item/accept":
      return updateItem(state, action.id, (item) => {
        const current = new Set([item.unit, ...(item.accepts ?? [])]);
        if (action.accepted) current.add(action.unit);
        else if (action.unit !== item.unit) current.delete(action.unit);
        const ordered = [item.unit, ...units.filter((u) => u !== item.unit && current.has(u))];
        return { ...item, accepts: ordered.length > 1 ? ordered : null };
      });
    case "item/rule":
      return updateItem(state, action.id, (item) => {
        if (action.patch === null) return { ...item, rule: null };
        const rule = item.rule ?? {
          min: "",
          max: "",
          nominal: "",
          tolerance: "",
          unit: item.unit,
          appliesTo: "each-cell" as const,
          output: "",
        };
        return { ...item, rule: { ...rule, ...action.patch } };
      });
    case "item/move": {
      const at = locate(state, action.id);
      const target = state.sections.findIndex((s) => s.id === action.sectionId);
      if (!at || target < 0) return state;
      const item = state.sections[at.sectionIndex].items[at.itemIndex];
      // The slot was counted with the item still in place: one less when it moves down its own section.
      const index =
        target === at.sectionIndex && action.index > at.itemIndex ? action.index - 1 : action.index;
      const sections = state.sections.map((s) => ({
        ...s,
        items: s.items.filter((i) => i.id !== action.id),
      }));
      const items = [...sections[target].items];
      items.splice(Math.max(0, Math.min(index, items.length)), 0, item);
      sections[target] = { ...sections[target], items };
      return { ...state, sections };
    }
    case "item/step": {
      const at = locate(state, action.id);
      if (!at) return state;
      const section = state.sections[at.sectionIndex];
      const index = at.itemIndex + action.by;
      if (index >= 0 && index < section.items.length) {
        return {
          ...state,
          sections: state.sections.map((s, i) =>
            i === at.sectionIndex ? { ...s, items: moveWithin(s.items, at.itemIndex, index) } : s,
          ),
        };
      }
      const neighbour = state.sections[at.sectionIndex + action.by];
      if (!neighbour) return state;
      return editorReducer(state, {
        type: "item/move",
        id: action.id,
        sectionId: neighbour.id,
        index: action.by < 0 ? neighbour.items.length : 0,
      });
    }
    case "item/remove":
      return {
        ...state,
        sections: state.sections.map((s) => ({ ...s, items: s.items.filter((i) => i.id !== action.id) })),
      };

    case "line/add":
      return {
        ...updateItem(state, action.itemId, (item) => lineReducer(item, action, state.nextId)),
        nextId: state.nextId + 1,
      };
    case "line/update":
    case "line/step":
    case "line/remove":
      return updateItem(state, action.itemId, (item) => lineReducer(item, action, state.nextId));

    case "calc/set":
      return updateItem(state, action.id, (item) => {
        const definition = calcDefinition(action.calc);
        // Bindings the new calculation also takes are kept; the rest have no input to feed.
        const inputs = definition
          ? Object.fromEntries(
              Object.entries(item.inputs).filter(([name]) => Object.hasOwn(definition.inputs, name)),
            )
          : {};
        return { ...item, calc: action.calc, inputs };
      });
    case "calc/bind":
      return updateItem(state, action.id, (item) => {
        const { [action.input]: _, ...others } = item.inputs;
        return {
          ...item,
          inputs: action.binding ? { ...item.inputs, [action.input]: action.binding } : others,
        };
      });
  }
}
