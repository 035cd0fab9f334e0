import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { connect as connectTcp } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { connect } from "../../db/connect.ts";
import { seedDemo } from "../../db/seeds/demo.ts";
import { seedLibrary } from "../../db/seeds/library.ts";
import { startS3Fake } from "../../scripts/s3-fake.ts";
import { freshDatabase } from "../support/database.ts";
import { serverArgs } from "../support/server-process.ts";

const PORT = Number(process.env.E2E_PORT ?? 3100);
const SMTP_PORT = Number(process.env.E2E_SMTP_PORT ?? 2626);
const S3_PORT = Number(process.env.E2E_S3_PORT ?? 4669);

async function waitFor(url: string, child: ChildProcess, what: string) {
  for (let i = 0; i < 150; i++) {
    if (child.exitCode !== null) throw new Error(`${what} exited with ${child.exitCode}`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${what} did not answer at ${url}`);
}

/**
 * Fails when something already listens on `port`: the health check would otherwise be answered by
 * that process (a server left over from an interrupted run) while ours fails to bind, and every
 * test would run against the wrong build, database and mail folder.
 */
async function ensureFree(port: number, what: string) {
  const taken = await new Promise<boolean>((resolve) => {
    const socket = connectTcp({ port, host: "127.0.0.1" });
    socket.once("connect", () => (socket.destroy(), resolve(true)));
    socket.once("error", () => resolve(false));
  });
  if (taken)
    throw new Error(
      `Port ${port} (${what}) is already in use by another process; stop it (e.g. a server left by an interrupted run) or choose another port with the E2E_* variables.`,
    );
}

/**
 * End-to-end tests run the production build (`node server.js`) against its own seeded
 * database, its own SMTP sink and its own S3 stand-in, exactly as `npm start` does, on other ports.
 */
export default async function setup() {
  await ensureFree(PORT, "E2E_PORT, the app server");
  await ensureFree(SMTP_PORT, "E2E_SMTP_PORT, the mail sink");
  await ensureFree(S3_PORT, "E2E_S3_PORT, the S3 stand-in");
  const databaseUrl = await freshDatabase("sternpost_e2e");
  const knex = connect(databaseUrl);
  await seedLibrary(knex);
  await seedDemo(knex);
  await knex.destroy();

  const mailDir = mkdtempSync(path.join(tmpdir(), "sternpost-mail-"));
  const s3 = await startS3Fake({
    port: S3_PORT,
    directory: mkdtempSync(path.join(tmpdir(), "sternpost-s3-")),
    bucket: "sternpost-photos",
  });
  const env = {
    ...process.env,
    NODE_ENV: "production",
    PORT: String(PORT),
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: "end-to-end-tests-secret-0123456789",
    APP_URL: `http://localhost:${PORT}`,
    SMTP_URL: `smtp://127.0.0.1:${SMTP_PORT}`,
    SMTP_PORT: String(SMTP_PORT),
    MAIL_SINK_DIR: mailDir,
    DEV_MAIL_PAGE: "on",
    S3_ENDPOINT: s3.endpoint,
    S3_BUCKET: "sternpost-photos",
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
    S3_FORCE_PATH_STYLE: "true",
  };
  const children: ChildProcess[] = [];
  const sink = spawn("node_modules/.bin/tsx", ["scripts/mail-sink.ts"], { env, stdio: "inherit" });
  children.push(sink);
  const server = spawn("node", serverArgs(), { env, stdio: ["ignore", "ignore", "inherit"] });
  children.push(server);
  await waitFor(`http://localhost:${PORT}/healthz`, server, "The app server");

  process.env.E2E_BASE_URL = `http://localhost:${PORT}`;
  process.env.E2E_DATABASE_URL = databaseUrl;
  process.env.E2E_MAIL_DIR = mailDir;

  return async () => {
    for (const child of children) child.kill("SIGTERM");
    await s3.close();
  };
}
