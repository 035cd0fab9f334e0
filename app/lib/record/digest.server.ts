import { createHash } from "node:crypto";
import { checklistCanonical, recordCanonical } from "./canonical";
import type { CommissioningRecord, RecordChecklist } from "./types";

/** SHA-256 of the text's UTF-8 bytes, as 64 lower-case hexadecimal digits. */
export function sha256Hex(text: string): string {
  return createHash("sha256").update(text, "utf8").digest("hex");
}

/** The digest stored when a checklist is countersigned (content: canonical.ts, checklistContent). */
export function checklistDigest(checklist: RecordChecklist): string {
  return sha256Hex(checklistCanonical(checklist));
}

/** The digest printed on the record and recomputed by the verification page (recordContent). */
export function recordDigest(record: CommissioningRecord): string {
  return sha256Hex(recordCanonical(record));
}
