import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { startMailSink } from "../../scripts/mail-sink.ts";
import { startS3Fake } from "../../scripts/s3-fake.ts";
import { freshDatabase } from "../support/database.ts";

// Integration tests share one fresh database and one S3 stand-in; files run one after another.
export default async function setup() {
  process.env.DATABASE_URL = await freshDatabase("sternpost_test");
  process.env.SESSION_SECRET ??= "integration-tests-secret-0123456789";
  process.env.LOGIN_ATTEMPTS = "5";

  // Any free port unless INTEGRATION_S3_PORT says (suites run side by side on one machine).
  const s3Dir = mkdtempSync(path.join(tmpdir(), "sternpost-s3-"));
  const s3 = await startS3Fake({
    port: Number(process.env.INTEGRATION_S3_PORT ?? 0),
    directory: s3Dir,
    bucket: "sternpost-photos-test",
  });
  Object.assign(process.env, {
    S3_ENDPOINT: s3.endpoint,
    S3_BUCKET: "sternpost-photos-test",
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
    S3_FORCE_PATH_STYLE: "true",
  });
  // Mail the code under test sends lands in a sink of its own.
  const mailDir = mkdtempSync(path.join(tmpdir(), "sternpost-mail-"));
  const sink = await startMailSink({ port: 0, directory: mailDir });
  Object.assign(process.env, { SMTP_URL: `smtp://127.0.0.1:${sink.port}`, MAIL_SINK_DIR: mailDir });
  return async () => {
    await sink.close();
    rmSync(mailDir, { recursive: true, force: true });
    await s3.close();
    rmSync(s3Dir, { recursive: true, force: true });
  };
}
