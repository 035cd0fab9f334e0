import { requireUser } from "./auth.server.ts";
import { invariantForbidden, invariantFound } from "./permissions.server.ts";
import { canReadRecord, findRecord } from "./records.server.ts";

/** An issued record, if this person may read it (surveyors: only those issued to them). */
export async function requireRecord(request: Request, recordId: string) {
  const user = await requireUser(request);
  const record = /^[0-9a-f-]{36}$/.test(recordId) ? await findRecord(recordId) : undefined;
  invariantFound(record, "There is no such record.");
  invariantForbidden(await canReadRecord(user, record), "This record was not issued to you.");
  return { user, record };
}
