import type { Template } from "~/lib/templates";
import type { hullTypes } from "~/lib/validation/vessels";
import type { jobScopes } from "~/lib/validation/jobs";

/**
 * The commissioning record as plain data: what the PDF, the surveyor's page and the
 * verification page are made from, and what the digests are computed over (canonical.ts).
 * People appear by name, times as ISO 8601 strings: the record must read the same years from
 * now, whatever became of the accounts behind it.
 */

/** The current value of one item, with the server revision that stored it. */
export interface RecordResponse {
  /** As the tablet stored it (values.ts); its verdict is recomputed, never stored. */
  value: unknown;
  rev: number;
  by: string;
  at: string;
}

/** One value an item had: every revision the server applied, in order. */
export interface RecordRevision {
  rev: number;
  value: unknown;
  by: string;
  at: string;
}

/** A reviewer's remark on an item. */
export interface RecordComment {
  itemKey: string;
  by: string;
  at: string;
  text: string;
}

/** A photo taken as evidence, by its UUID and the SHA-256 of the stored file. */
export interface RecordPhoto {
  itemKey: string;
  id: string;
  sha256: string;
}

export interface RecordChecklist {
  id: string;
  templateKey: string;
  templateVersion: number;
  /** The published version the checklist was filled from (immutable once published). */
  template: Template;
  responses: Record<string, RecordResponse>;
  history: Record<string, RecordRevision[]>;
  comments: RecordComment[];
  photos: RecordPhoto[];
  submittedBy?: string;
  submittedAt?: string;
  countersignedBy?: string;
  countersignedAt?: string;
  /** SHA-256 (hex) of the checklist's canonical content, stored when it was countersigned. */
  digest: string;
}

export interface RecordVessel {
  name: string;
  hin?: string;
  lengthValue: number;
  lengthUnit: "ft" | "m";
  hullType: (typeof hullTypes)[number];
  ownerName: string;
}

/** The job and the equipment it installed. */
export interface RecordJob {
  id: number;
  scope: (typeof jobScopes)[number];
  engineModel: string;
  engineSerial: string;
  ratedPowerHp: number;
  ratedRpmMin: number;
  ratedRpmMax: number;
  /** 2.5 for a 2.5 : 1 reduction. */
  gearRatio: number;
  propDiameterIn: number;
  propPitchIn: number;
  propBlades: number;
  shaftDiameterIn: number;
  shaftMaterial: string;
  couplingType: string;
  /** ISO dates (YYYY-MM-DD); a job may have none. */
  startDate: string | null;
  dueDate: string | null;
  leadName: string;
  technicianNames: string[];
}

export interface CommissioningRecord {
  record: { id: string; issuedAt: string };
  yardName: string;
  vessel: RecordVessel;
  job: RecordJob;
  checklists: RecordChecklist[];
  /** Where the QR code points; not part of the record's digest (it may embed the digest). */
  verifyUrl: string;
}
