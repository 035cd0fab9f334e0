import { test } from "vitest";
import { commissioningRecordFixture } from "../../support/record-fixture";
import { evaluateAll } from "~/lib/templates";
test("peek", () => {
  const r = commissioningRecordFixture();
  for (const c of r.checklists) {
    const v = evaluateAll(c.template, Object.fromEntries(Object.entries(c.responses).map(([k, x]) => [k, x.value])));
    for (const [k, x] of Object.entries(v)) console.log(c.templateKey, k, x.status, x.message);
    console.log(c.digest);
  }
});
