import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

/** Waits for a message to reach the test's SMTP sink. */
export async function waitForMail(to: string, timeoutMs = 10_000) {
  const dir = process.env.E2E_MAIL_DIR!;
  const started = Date.now();
  while (Date.now() - started < timeoutMs) {
    for (const name of readdirSync(dir)) {
      const message = JSON.parse(readFileSync(path.join(dir, name), "utf8"));
      if (message.to.includes(to)) return message as { subject: string; text: string; to: string[] };
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`No mail reached ${to}`);
}
