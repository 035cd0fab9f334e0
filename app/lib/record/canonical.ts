import canonicalize from "canonicalize";
import type { CommissioningRecord, RecordChecklist } from "./types";

/**
 * The exact bytes a digest is taken over. Pure (string out), so the browser can build the same
 * text the server hashes; the hashing itself is in digest.server.ts.
 *
 * Why RFC 8785 (JSON Canonicalization Scheme) rather than JSON.stringify: JSON.stringify writes
 * keys in insertion order, which depends on how a row happened to be read, so the same content
 * could give two digests. JCS sorts keys by UTF-16 code units, writes numbers as ECMAScript does
 * (shortest round-trip form, 1e+21, -0 as 0) and strings with minimal escaping: one content, one
 * byte string, on the server now, in the browser, and in another language's JCS implementation
 * years from now when a surveyor re-checks the record.
 */
export function canonicalJson(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new TypeError("This value has no JSON form and cannot be canonicalised.");
  return text;
}

/**
 * Names of the digest definitions, inside the hashed text: a checklist's digest can never equal a
 * record's, and a later change of definition gets a new name instead of silently new digests.
 */
export const CHECKLIST_SCHEME = "sternpost-checklist-1";
export const RECORD_SCHEME = "sternpost-record-1";

/** One instant, one spelling: "2025-05-14T09:30:00Z" and "…09:30:00.000Z" hash alike. */
function instant(at: string): string {
  const time = new Date(at);
  if (Number.isNaN(time.getTime())) throw new RangeError(`"${at}" is not a date and time.`);
  return time.toISOString();
}

const byText = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

function mapValues<T, U>(map: Record<string, T>, f: (value: T) => U): Record<string, U> {
  return Object.fromEntries(Object.entries(map).map(([key, value]) => [key, f(value)]));
}

/**
 * What a lead countersigns, field by field: the checklist, its template key and version, every
 * response (value, revision, author, time), every revision each item went through, the review
 * comments and the photo digests. Lists come in a fixed order (revisions by number, comments by
 * time, photos by item and id) so the order rows were read in cannot change the digest. The
 * stored digest and the signatures are not part of it: they are made from it.
 */
export function checklistContent(checklist: RecordChecklist) {
  return {
    scheme: CHECKLIST_SCHEME,
    checklistId: checklist.id,
    templateKey: checklist.templateKey,
    templateVersion: checklist.templateVersion,
    responses: mapValues(checklist.responses, (r) => ({
      value: r.value,
      rev: r.rev,
      by: r.by,
      at: instant(r.at),
    })),
    history: mapValues(checklist.history, (revisions) =>
      revisions
        .map((r) => ({ rev: r.rev, value: r.value, by: r.by, at: instant(r.at) }))
        .sort((a, b) => a.rev - b.rev),
    ),
    comments: checklist.comments
      .map((c) => ({ itemKey: c.itemKey, by: c.by, at: instant(c.at), text: c.text }))
      .sort(
        (a, b) =>
          byText(a.at, b.at) || byText(a.itemKey, b.itemKey) || byText(a.by, b.by) || byText(a.text, b.text),
      ),
    photos: checklist.photos
      .map((p) => ({ itemKey: p.itemKey, id: p.id, sha256: p.sha256 }))
      .sort((a, b) => byText(a.itemKey, b.itemKey) || byText(a.id, b.id)),
  };
}

/** The canonical text a checklist's digest is the SHA-256 of. */
export function checklistCanonical(checklist: RecordChecklist): string {
  return canonicalJson(checklistContent(checklist));
}

/**
 * The whole record as issued, less the verification link: the record's id and issue time, the
 * yard, vessel and job, and each checklist's countersigned content together with the template
 * it was filled from, its stored digest, and who submitted and countersigned it and when.
 */
export function recordContent(record: CommissioningRecord) {
  return {
    scheme: RECORD_SCHEME,
    record: { id: record.record.id, issuedAt: instant(record.record.issuedAt) },
    yardName: record.yardName,
    vessel: record.vessel,
    job: record.job,
    checklists: record.checklists.map((checklist) => ({
      content: checklistContent(checklist),
      template: checklist.template,
      digest: checklist.digest,
      submittedBy: checklist.submittedBy,
      submittedAt: checklist.submittedAt === undefined ? undefined : instant(checklist.submittedAt),
      countersignedBy: checklist.countersignedBy,
      countersignedAt:
        checklist.countersignedAt === undefined ? undefined : instant(checklist.countersignedAt),
    })),
  };
}

/** The canonical text a record's digest is the SHA-256 of. */
export function recordCanonical(record: CommissioningRecord): string {
  return canonicalJson(recordContent(record));
}
