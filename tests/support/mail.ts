import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

type Sunk = { subject: string; text: string; to: string[] };

/**
 * The end-to-end server's SMTP sink by default; integration tests pass their own setup's folder
 * (MAIL_SINK_DIR), since a whole-suite run sets both variables in every worker.
 */
const e2eSink = () => process.env.E2E_MAIL_DIR!;

/** Every message the sink holds for an address, in no particular order. */
export function mailTo(to: string, dir = e2eSink()): Sunk[] {
  return readdirSync(dir)
    .filter((name) => name.endsWith(".json"))
    .map((name) => JSON.parse(readFileSync(path.join(dir, name), "utf8")) as Sunk)
    .filter((message) => message.to.includes(to));
}

/** Waits for a message to reach the test's SMTP sink (the first that matches, if a subject is given). */
export async function waitForMail(to: string, timeoutMs = 10_000, subject?: RegExp, dir = e2eSink()) {
  const started = Date.now();
  while (Date.now() - started < timeoutMs) {
    const found = mailTo(to, dir).find((m) => !subject || subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`No mail reached ${to}`);
}
