import type { Knex } from "knex";
import * as m001 from "./001_people.ts";
import * as m002 from "./002_vessels_and_jobs.ts";
import * as m003 from "./003_checklist_templates.ts";
import * as m004 from "./004_responses_and_sync.ts";
import * as m005 from "./005_photos.ts";
import * as m006 from "./006_review_and_records.ts";
import * as m007 from "./007_sync_hardening.ts";
import * as m008 from "./008_utf8mb4_everywhere.ts";
import * as m009 from "./009_job_shaft_system_and_voltage.ts";
import * as m012 from "./012_notifications_and_replies.ts";
import * as m014 from "./014_yard_settings.ts";
import * as m015 from "./015_seal_by_key.ts";
import * as m016 from "./016_current_value_is_latest_history.ts";
import * as m017 from "./017_current_rows_by_checklist.ts";
import * as m018 from "./018_mail_outbox.ts";

// Listed explicitly so the same migrations load under tsx, vitest and the Vite build alike.
const migrations: Record<string, Knex.Migration> = {
  "001_people": m001,
  "002_vessels_and_jobs": m002,
  "003_checklist_templates": m003,
  "004_responses_and_sync": m004,
  "005_photos": m005,
  "006_review_and_records": m006,
  "007_sync_hardening": m007,
  "008_utf8mb4_everywhere": m008,
  "009_job_shaft_system_and_voltage": m009,
  "012_notifications_and_replies": m012,
  "014_yard_settings": m014,
  "015_seal_by_key": m015,
  "016_current_value_is_latest_history": m016,
  "017_current_rows_by_checklist": m017,
  "018_mail_outbox": m018,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations),
  getMigrationName: (name) => name,
  getMigration: async (name) => migrations[name]!,
};
