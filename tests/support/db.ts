import { connect } from "../../db/connect.ts";

/** A direct connection for tests that look behind the application's back. */
export function testDb() {
  return connect(process.env.DATABASE_URL!);
}
