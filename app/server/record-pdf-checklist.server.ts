/** The record PDF's checklist pages: the header, each section and item with its value, verdict, attempts and results. */
import { presentValue } from "~/lib/calc/present";
import { convert } from "~/lib/calc/units";
import { earlierRevisions } from "~/lib/record/earlier";
import type { RecordChecklist, RecordRevision } from "~/lib/record/types";
import {
  calcDefinition,
  describeRule,
  evaluate,
  findItem,
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
import {
  MARGIN,
  ink,
  inkSoft,
  rule,
  paper,
  copper,
  sound,
  brass,
  size,
  type Column,
  type Cell,
  Writer,
  sum,
  spread,
  TNUM,
} from "./record-pdf-writer.server.ts";
import { when, minus, entered, quantity } from "./record-pdf-words.server.ts";
import { type Reading, readVerdict, tally, tallyWords, valuesOf } from "./record-pdf-verdicts.server.ts";
import { svgForCalc, placeSvg } from "./record-pdf-diagrams.server.ts";
import { photoReferences, type PhotoFiles, photoPictures } from "./record-pdf-photos.server.ts";
import { keyValueHeight, keyValues } from "./record-pdf-cover.server.ts";

export function checklistHeader(w: Writer, checklist: RecordChecklist, index: number, count: number): void {
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
        ? `${checklist.submittedBy}, ${checklist.submittedAt ? when(checklist.submittedAt, w.timeZone) : "time not recorded"}`
        : "not submitted",
    ],
    [
      "Countersigned",
      checklist.countersignedBy
        ? `${checklist.countersignedBy}, ${checklist.countersignedAt ? when(checklist.countersignedAt, w.timeZone) : "time not recorded"}`
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

export function sectionHeading(w: Writer, index: number, title: string, firstItemNeeds: number): void {
  w.ensure(36 + firstItemNeeds);
  w.y += 6;
  w.style("bold", size.h2, ink);
  w.doc.text(w.printable(`${index + 1}   ${title}`), w.left, w.y, { width: w.width });
  w.y += 2;
  w.rule(ink, 1);
  w.y += 8;
}

export const GUTTER = 30;

/** What every item of one checklist is rendered against. */
export interface ChecklistContext {
  checklist: RecordChecklist;
  responses: Record<string, unknown>;
  /** "2.3" by item key, for cross-references. */
  numbers: Map<string, string>;
  photoFiles: PhotoFiles;
}

export function itemBlock(w: Writer, ctx: ChecklistContext, item: Item): void {
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
    w.paragraph(`Entered by ${response.by}, ${when(response.at, w.timeZone)} (revision ${response.rev})`, {
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
    w.labelled(`Review comment, ${comment.by}, ${when(comment.at, w.timeZone)}`, comment.text, {
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
export function itemNeeds(w: Writer, ctx: ChecklistContext, item: Item): number {
  const width = w.width - GUTTER;
  const verdict = evaluate(item, ctx.responses[item.key], {
    template: ctx.checklist.template,
    responses: ctx.responses,
  });
  w.style("bold", size.label);
  return w.height(item.label, width) + 44 + leadIn(w, item, readVerdict(item, verdict), width);
}

export function leadIn(w: Writer, item: Item, reading: Reading, width: number): number {
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

export function ruleOf(item: Item, verdict: Verdict): string | undefined {
  if ((item.kind === "measure" || item.kind === "readings") && item.rule) return describeRule(item.rule);
  if (item.kind === "calc" && verdict.outcome && verdict.outcome.verdict !== "info")
    return verdict.outcome.rule;
  return undefined;
}

export function noteOf(value: unknown): string | undefined {
  const note =
    value && typeof value === "object" && "note" in value ? (value as { note?: unknown }).note : undefined;
  return typeof note === "string" && note.trim() ? note.trim() : undefined;
}

/** An entry in a few words, for the list of earlier entries. */
export function valueWords(item: Item, value: unknown): string {
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
export function earlierEntries(
  w: Writer,
  item: Item,
  history: RecordRevision[],
  currentRev: number,
  indent: number,
): void {
  for (const revision of earlierRevisions(item, history, currentRev)) {
    const note = noteOf(revision.value);
    const words = [valueWords(item, revision.value), note ? `note: ${note}` : undefined]
      .filter(Boolean)
      .join("; ");
    w.style("regular", size.small, inkSoft);
    w.paragraph(
      `Earlier, revision ${revision.rev}: ${words} (${revision.by}, ${when(revision.at, w.timeZone)})`,
      {
        indent,
        tnum: true,
      },
    );
  }
}

export function itemValue(
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
      w.labelled("Initials", `${v.initials}, ${v.by}, ${when(v.at, w.timeZone)}`, { indent });
      return;
    }
    default:
      return;
  }
}

export function attemptMark(item: MeasureItem | ReadingsItem, verdict: Verdict): Cell["mark"] {
  if (!item.rule) return undefined;
  if (verdict.status === "ok") return { shape: "tick", colour: sound };
  if (verdict.status === "out-of-range") return { shape: "triangle", colour: brass };
  return undefined;
}

/** A struck attempt stays in the record, marked with who struck it, when and why (docs/sync-merge-rules.md). */
function struck(w: Writer, value: MeasureValue | ReadingsValue, attempt: { id?: string }): string {
  const strike = strikeOf(value, attempt);
  return strike ? ` · STRUCK THROUGH by ${strike.by}, ${when(strike.at, w.timeZone)}: ${strike.reason}` : "";
}

export function measureAttempts(w: Writer, item: MeasureItem, value: MeasureValue, indent: number): void {
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
      { text: (last ? `${i + 1} (reported)` : String(i + 1)) + struck(w, value, attempt), bold: last },
      { text: entered(attempt.value, attempt.unit), bold: last, mark: attemptMark(item, own) },
      ...(converted ? [{ text: quantity(convert(attempt.value, attempt.unit, ruleUnit!), ruleUnit!) }] : []),
      { text: attempt.by },
      { text: when(attempt.at, w.timeZone) },
    ];
  });
  w.table(columns, rows, { indent });
  w.y += 4;
}

export function readingsAttempts(w: Writer, item: ReadingsItem, value: ReadingsValue, indent: number): void {
  const attempts = value.attempts ?? [];
  const width = w.width - indent;
  const labelWidth = Math.min(170, width * 0.34);
  const cellWidth = (width - labelWidth) / item.columns.length;
  attempts.forEach((attempt, i) => {
    const last = attempt === liveAttempts(value).at(-1);
    const own = evaluate(item, { attempts: [attempt] });
    const offending = own.offending ?? [];
    const caption = `Attempt ${i + 1} of ${attempts.length}${last ? " (reported)" : ""} · values in ${unitSymbol(attempt.unit)} · ${attempt.by}, ${when(attempt.at, w.timeZone)}${struck(w, value, attempt)}`;
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
      const words = own.status === "ok" ? "Within the rule." : (own.account ?? own.message);
      w.style("regular", size.small, own.status === "ok" ? sound : brass);
      w.paragraph(words, { indent, tnum: true });
    }
    w.y += 5;
  });
}

export function calcResult(
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
export function keyLabels(template: Template, item: CalcItem): Map<string, string> {
  const labels = new Map<string, string>();
  for (const binding of Object.values(item.inputs)) {
    if (!("item" in binding)) continue;
    const source = findItem(template, binding.item);
    if (source?.kind !== "readings") continue;
    for (const line of [...source.rows, ...source.columns]) labels.set(line.key, line.label);
  }
  return labels;
}

/** The share of a page that must be free for a checklist to start on it rather than on a new page. */
export const CHECKLIST_START_ROOM = 0.4;

export function checklistPages(
  w: Writer,
  checklist: RecordChecklist,
  index: number,
  count: number,
  photoFiles: PhotoFiles,
): void {
  w.currentTitle = `${index + 1}. ${checklist.template.title}`;
  // A checklist opens a page only when the page it would share is the cover or is mostly used:
  // a forced break after a short spill-over (the cover's last lines, a checklist's end) left
  // pages four-fifths blank.
  const onCover = w.doc.bufferedPageRange().count === 1;
  if (onCover || w.bottom - w.y < (w.bottom - MARGIN.top) * CHECKLIST_START_ROOM) w.newPage();
  else {
    w.pageTitles[w.pageTitles.length - 1] += ` · ${w.currentTitle}`;
    w.y += 18;
    w.rule(ink, 1.5);
    w.y += 14;
  }
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
