import { z } from "zod";

const DEV_SECRET = "sternpost-development-secret-do-not-use";

const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().url().default("mysql://root@127.0.0.1:3307/sternpost"),
  SESSION_SECRET: z.string().min(16).default(DEV_SECRET),
  APP_URL: z.string().url().default("http://localhost:3000"),
  SMTP_URL: z.string().default("smtp://127.0.0.1:2525"),
  MAIL_FROM: z.string().default("Sternpost <no-reply@sternpost.invalid>"),
  /** The boatyard's name, printed on its commissioning records. */
  YARD_NAME: z.string().min(1).default("Kittiwake Slip"),
  /** The yard's time zone until a manager sets it on /yard (an IANA name, like Europe/Lisbon). */
  YARD_TIME_ZONE: z.string().min(1).default("UTC"),
  /** Folder where the local SMTP sink keeps messages; when set, /dev/mail shows them to managers. */
  MAIL_SINK_DIR: z.string().optional(),
  /** Seconds between looks at the mail outbox, and the first wait before a failed message is tried again. */
  MAIL_RETRY_S: z.coerce.number().positive().default(30),
  /** A production server shows /dev/mail only when asked explicitly (npm start's local demo does). */
  DEV_MAIL_PAGE: z.enum(["on", "off"]).default("off"),
  /** Login attempts allowed per account and per address in 15 minutes. */
  LOGIN_ATTEMPTS: z.coerce.number().int().positive().default(8),
  /** The S3-compatible store for photos; the defaults are the local stand-in (scripts/s3-fake.ts). */
  S3_ENDPOINT: z.string().url().default("http://127.0.0.1:4569"),
  S3_REGION: z.string().min(1).default("us-east-1"),
  S3_BUCKET: z.string().min(3).default("sternpost-photos"),
  S3_ACCESS_KEY_ID: z.string().min(1).default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default("S3RVER"),
  /** Bucket in the path (http://host/bucket/key), as most stand-ins and self-hosted stores need. */
  S3_FORCE_PATH_STYLE: z
    .enum(["true", "false"])
    .default("true")
    .transform((v) => v === "true"),
  /** The largest photo accepted, in bytes; the tablet compresses to well under it. */
  PHOTO_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(5 * 1024 * 1024),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

/** Parsed once; a production server refuses to start with the development secret. */
export function env(): Env {
  if (cached) return cached;
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const fields = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`Invalid environment: ${fields}`);
  }
  if (parsed.data.NODE_ENV === "production" && parsed.data.SESSION_SECRET === DEV_SECRET) {
    throw new Error("SESSION_SECRET must be set to a secret of your own in production.");
  }
  cached = parsed.data;
  return cached;
}
