import { freshDatabase } from "../support/database.ts";

// Integration tests share one fresh database; files run one after another.
export default async function setup() {
  process.env.DATABASE_URL = await freshDatabase("sternpost_test");
  process.env.SESSION_SECRET ??= "integration-tests-secret-0123456789";
  process.env.LOGIN_ATTEMPTS = "5";
}
