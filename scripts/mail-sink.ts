// The local SMTP stand-in: accepts every message on loopback and keeps it as JSON in MAIL_SINK_DIR.
import { simpleParser } from "mailparser";
import { randomUUID } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { SMTPServer } from "smtp-server";

const dir = process.env.MAIL_SINK_DIR ?? path.resolve(".data/mail");
const port = Number(process.env.SMTP_PORT ?? 2525);
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const id = randomUUID();
        const to = session.envelope.rcptTo.map((r) => r.address);
        const message = {
          id,
          receivedAt: new Date().toISOString(),
          from: mail.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
          to,
          subject: mail.subject ?? "",
          text: mail.text ?? "",
        };
        writeFileSync(path.join(dir, `${message.receivedAt.replace(/[:.]/g, "-")}-${id}.json`), JSON.stringify(message, null, 2));
        callback();
      })
      .catch(callback);
  },
});

server.listen(port, "127.0.0.1", () => console.log(`SMTP sink on 127.0.0.1:${port}, keeping mail in ${dir}`));
for (const signal of ["SIGTERM", "SIGINT"] as const) process.on(signal, () => server.close(() => process.exit(0)));
