import { isTimeZone } from "~/lib/format";
import type { YardInput } from "~/lib/validation/yard";
import { audit } from "./audit.server.ts";
import { db } from "./db.server.ts";
import { env } from "./env.server.ts";

export interface Yard {
  name: string;
  /** IANA name; every date on every screen and in the PDF is written in it. */
  timeZone: string;
}

/** The yard's settings: the stored row, or YARD_NAME and YARD_TIME_ZONE (UTC) until a manager saves them. */
export async function yardSettings(): Promise<Yard> {
  const row = await db()("yard_settings").where({ id: 1 }).first();
  const fallbackZone = isTimeZone(env().YARD_TIME_ZONE) ? env().YARD_TIME_ZONE : "UTC";
  return {
    name: row?.name ?? env().YARD_NAME,
    timeZone: row && isTimeZone(row.time_zone) ? row.time_zone : fallbackZone,
  };
}

export async function saveYardSettings(input: YardInput, userId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const row = { name: input.name, time_zone: input.timeZone, updated_by: userId, updated_at: new Date() };
    await trx("yard_settings")
      .insert({ id: 1, ...row })
      .onConflict("id")
      .merge();
    await audit(
      {
        userId,
        action: "yard.updated",
        entity: "yard",
        entityId: 1,
        detail: { name: input.name, timeZone: input.timeZone },
      },
      trx,
    );
  });
}
