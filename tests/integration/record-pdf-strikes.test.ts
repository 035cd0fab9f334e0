import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, expect, test } from "vitest";
import { recordDigest } from "~/lib/record/digest.server";
import type { MeasureValue } from "~/lib/templates";
import { renderRecordPdf } from "~/server/record-pdf.server";
import { commissioningRecordFixture } from "../support/record-fixture";

/** Issue 15 §1: a struck attempt stays in the record (the PDF), struck, with who, when and why. */
const dir = mkdtempSync(join(tmpdir(), "sternpost-strikes-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

test("the PDF shows a struck attempt with its reason, and reports the last attempt not struck", async () => {
  const record = commissioningRecordFixture();
  const shaft = record.checklists.find((c) => c.template.key === "propeller-shaft-and-coupling")!;
  const face = shaft.responses["face-runout"]!.value as MeasureValue;
  const [first, second] = face.attempts.map((a) => ({ ...a, id: crypto.randomUUID() }));
  // The second attempt is struck: the first one (0.0016 in) is what is reported.
  face.attempts = [first!, second!];
  face.strikes = [
    {
      attempt: second!.id,
      reason: "Read on the wrong face",
      at: "2025-05-12T12:00:00Z",
      by: "Orla Penhallow",
    },
  ];
  const digest = recordDigest(record);
  const file = join(dir, "record.pdf");
  writeFileSync(file, await renderRecordPdf(record, { digest, verifyUrl: record.verifyUrl }));
  const text = execFileSync("pdftotext", ["-layout", "-enc", "UTF-8", file, "-"], { encoding: "utf8" });
  const flat = text.replace(/\s+/g, " ");
  // The table wraps the attempt's cell: "2 · STRUCK" beside the value, "THROUGH by …" below it.
  const struck =
    /2 · STRUCK [\s\S]{0,80}THROUGH by Orla Penhallow, 12 May 2025, 12:00 UTC: Read on the wrong face/;
  expect(struck.test(flat), "the struck attempt with who, when and why").toBe(true);
  expect(/1 \(reported\) 0\.0016 in/.test(flat), "the attempt not struck is reported").toBe(true);
});
