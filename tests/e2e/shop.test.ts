import { describe, expect, it } from "vitest";
import {
  CHECKLIST_BUDGET_KB,
  CHECKLIST_ROUTE,
  firstLoadKb,
  firstLoadFiles,
} from "../../scripts/route-sizes.ts";

// The end-to-end project runs on the production build, which is what the route-size figure reads.
describe("the checklist screen's weight", () => {
  it(`loads at most ${CHECKLIST_BUDGET_KB} KB of gzipped JavaScript first, with no full zod or calculation registry`, () => {
    // Issue 16 measured 181.5 KB (the schemas chunk alone 26 KB); `npm run sizes` prints the figure.
    expect(firstLoadKb(CHECKLIST_ROUTE)).toBeLessThanOrEqual(CHECKLIST_BUDGET_KB);
    const files = [...firstLoadFiles(CHECKLIST_ROUTE)].join(" ");
    // The registry and the diagrams come on demand, for a template with calc items.
    expect(files).not.toMatch(/registry-|for-calc-|photo-editor-/);
  });
});
