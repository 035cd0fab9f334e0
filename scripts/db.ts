// Database chores for the start script and for people: tsx scripts/db.ts create migrate seed | rollback
import { connect, createDatabase } from "../db/connect.ts";
import { seedDemo } from "../db/seeds/demo.ts";
import { seedDemoStory } from "../db/seeds/demo-story.ts";
import { seedLibrary } from "../db/seeds/library.ts";

const url = process.env.DATABASE_URL ?? "mysql://root@127.0.0.1:3307/sternpost";
const steps = process.argv.slice(2);

if (steps.includes("create")) await createDatabase(url);
const knex = connect(url);
try {
  if (steps.includes("migrate")) {
    const [, applied] = await knex.migrate.latest();
    console.log(
      applied.length ? `[sternpost] migrated: ${applied.join(", ")}` : "[sternpost] database is up to date",
    );
  }
  if (steps.includes("rollback")) {
    const [, undone] = await knex.migrate.rollback(undefined, true);
    console.log(`[sternpost] rolled back: ${undone.join(", ") || "nothing"}`);
  }
  if (steps.includes("seed")) {
    console.log(`[sternpost] ${await seedLibrary(knex)}`);
    const summary = await seedDemo(knex);
    console.log(`[sternpost] demo data: ${summary}`);
    console.log(`[sternpost] demo story: ${await seedDemoStory(knex)}`);
  }
} finally {
  await knex.destroy();
}
