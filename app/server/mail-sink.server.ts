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

/** The sink's folder when its page is on: never in production unless DEV_MAIL_PAGE=on says so. */
function pageDirectory() {
  const { MAIL_SINK_DIR, NODE_ENV, DEV_MAIL_PAGE } = env();
  return NODE_ENV === "production" && DEV_MAIL_PAGE !== "on" ? undefined : MAIL_SINK_DIR;
}

/** Messages caught by the local SMTP sink (scripts/mail-sink.ts), newest first; null when off. */
export async function listSunkMail(): Promise<SunkMessage[] | null> {
  const dir = pageDirectory();
  if (!dir) return null;
  const names = (await readdir(dir).catch(() => [])).filter((n) => n.endsWith(".json"));
  const messages = await Promise.all(
    names.map(async (n) => JSON.parse(await readFile(path.join(dir, n), "utf8")) as SunkMessage),
  );
  return messages.sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
}
