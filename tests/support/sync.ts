import { randomUUID } from "node:crypto";
import type { Operation } from "~/lib/sync/protocol";

let seq = 0;
/** A sync operation as a device would send it. */
export const op = (
  checklistId: string,
  itemKey: string,
  value: Operation["value"],
  baseRev: number,
  extra: Partial<Operation> = {},
): Operation => ({
  opId: randomUUID(),
  seq: ++seq,
  checklistId,
  itemKey,
  value,
  baseRev,
  at: new Date().toISOString(),
  ...extra,
});

export const check = (result: "pass" | "fail" | "na", note?: string) => ({
  result,
  ...(note ? { note } : {}),
});
