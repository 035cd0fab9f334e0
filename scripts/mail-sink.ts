// The local SMTP stand-in: accepts every message on loopback and keeps it as JSON in a folder.
// Run by the start and test scripts (tsx scripts/mail-sink.ts), or started in-process by tests.
import { simpleParser } from "mailparser";
import { randomUUID } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { SMTPServer } from "smtp-server";

export async function startMailSink({ port, directory }: { port: number; directory: string }) {
  mkdirSync(directory, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const id = randomUUID();
          const message = {
            id,
            receivedAt: new Date().toISOString(),
            from: mail.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
          };
          writeFileSync(
            path.join(directory, `${message.receivedAt.replace(/[:.]/g, "-")}-${id}.json`),
            JSON.stringify(message, null, 2),
          );
          callback();
        })
        .catch(callback);
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve());
  });
  const bound = (server.server.address() as AddressInfo).port;
  return { port: bound, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const directory = process.env.MAIL_SINK_DIR ?? path.resolve(".data/mail");
  const sink = await startMailSink({ port: Number(process.env.SMTP_PORT ?? 2525), directory });
  console.log(`SMTP sink on 127.0.0.1:${sink.port}, keeping mail in ${directory}`);
  for (const signal of ["SIGTERM", "SIGINT"] as const)
    process.on(signal, () => void sink.close().then(() => process.exit(0)));
}
