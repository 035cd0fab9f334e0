import type { Knex } from "knex";
import { seedDemo } from "./demo.ts";
import { seedDemoStory } from "./demo-story.ts";
import { seedLibrary } from "./library.ts";

// Entry point for `knex seed:run`; the start script calls seedDemo directly.
export async function seed(knex: Knex) {
  await seedLibrary(knex);
  await seedDemo(knex);
  await seedDemoStory(knex);
}
