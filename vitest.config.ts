import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

// The tests run without the React Router and PWA plugins: unit tests need nothing else,
// integration tests get a fresh MariaDB database, end-to-end tests drive Chromium against
// the production build (see tests/setup).
export default defineConfig({
  resolve: { alias: { "~": fileURLToPath(new URL("./app", import.meta.url)) } },
  test: {
    environment: "node",
    testTimeout: 20_000,
    hookTimeout: 120_000,
    projects: [
      { extends: true, test: { name: "unit", include: ["tests/unit/**/*.test.{ts,tsx}"] } },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          globalSetup: ["tests/setup/integration.ts"],
          fileParallelism: false,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          globalSetup: ["tests/setup/e2e.ts"],
          fileParallelism: false,
          testTimeout: 60_000,
          // What a poll waits for here often crosses a sync round trip on a busy machine.
          expect: { poll: { timeout: 10_000 } },
        },
      },
    ],
  },
});
