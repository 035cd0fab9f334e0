import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { env } from "./env.server.ts";

export interface SunkMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
}

/** Messages caught by the local SMTP sink (scripts/mail-sink.ts), newest first. */
export async function listSunkMail(): Promise<SunkMessage[] | null> {
  const dir = env().MAIL_SINK_DIR;
  if (!dir) return null;
  const names = (await readdir(dir).catch(() => [])).filter((n) => n.endsWith(".json"));
  const messages = await Promise.all(
    names.map(async (n) => JSON.parse(await readFile(path.join(dir, n), "utf8")) as SunkMessage),
  );
  return messages.sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
}
