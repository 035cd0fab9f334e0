import { test } from "vitest";
import { writeFileSync } from "node:fs";
import { commissioningRecordFixture } from "../../support/record-fixture";
import { recordDigest } from "~/lib/record/digest.server";
import { renderRecordPdf } from "~/server/record-pdf.server";
test("peek", async () => {
  const r = commissioningRecordFixture();
  const pdf = await renderRecordPdf(r, { digest: recordDigest(r), verifyUrl: r.verifyUrl });
  writeFileSync("/tmp/record.pdf", pdf);
});
