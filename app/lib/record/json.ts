import { describeRule, evaluateAll, type Item } from "~/lib/templates";
import { recordContent } from "./canonical";
import { inWorkOrder } from "./order";
import type { CommissioningRecord, RecordChecklist } from "./types";

/**
 * The record as documented JSON (docs/record-json.md) for a warranty desk or an insurer: the
 * readable part (vessel, job, checklists in the order of work, each item's value, verdict and
 * signers) and `signedContent`, the exact object whose RFC 8785 canonical form has the record's
 * SHA-256 digest, so a reader can check the file without trusting the yard's server.
 */
export const RECORD_JSON_FORMAT = "sternpost-record-json-1";

function itemEntry(
  checklist: RecordChecklist,
  item: Item,
  section: string,
  verdicts: ReturnType<typeof evaluateAll>,
) {
  const response = checklist.responses[item.key];
  const verdict = verdicts[item.key]!;
  const rule = "rule" in item && item.rule ? describeRule(item.rule) : undefined;
  return {
    section,
    key: item.key,
    label: item.label,
    kind: item.kind,
    required: item.required ?? false,
    ...(rule ? { rule } : {}),
    value: response?.value ?? null,
    ...(verdict.outcome ? { result: verdict.outcome } : {}),
    verdict: {
      status: verdict.status,
      done: verdict.done,
      finding: verdict.finding ?? null,
      words: verdict.message,
    },
    enteredBy: response?.by ?? null,
    enteredAt: response?.at ?? null,
    revisions: checklist.history[item.key]?.length ?? 0,
    comments: checklist.comments
      .filter((c) => c.itemKey === item.key)
      .map((c) => ({ by: c.by, at: c.at, text: c.text })),
    photos: checklist.photos
      .filter((p) => p.itemKey === item.key)
      .map((p) => ({ id: p.id, sha256: p.sha256 })),
  };
}

function checklistEntry(checklist: RecordChecklist) {
  const values = Object.fromEntries(Object.entries(checklist.responses).map(([k, r]) => [k, r.value]));
  const verdicts = evaluateAll(checklist.template, values);
  return {
    id: checklist.id,
    title: checklist.template.title,
    templateKey: checklist.templateKey,
    templateVersion: checklist.templateVersion,
    digest: checklist.digest,
    submittedBy: checklist.submittedBy ?? null,
    submittedAt: checklist.submittedAt ?? null,
    countersignedBy: checklist.countersignedBy ?? null,
    countersignedAt: checklist.countersignedAt ?? null,
    items: checklist.template.sections.flatMap((section) =>
      section.items.map((item) => itemEntry(checklist, item, section.title, verdicts)),
    ),
  };
}

export function recordJson(record: CommissioningRecord, digest: string) {
  return {
    format: RECORD_JSON_FORMAT,
    digest: { algorithm: "SHA-256", canonicalization: "RFC 8785 (JCS) of signedContent", value: digest },
    verifyUrl: record.verifyUrl,
    record: record.record,
    yard: record.yardName,
    vessel: record.vessel,
    job: record.job,
    checklists: inWorkOrder(record.checklists).map(checklistEntry),
    signedContent: recordContent(record),
  };
}
