import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { recordDigest } from "~/lib/record/digest.server";
import type { CommissioningRecord } from "~/lib/record/types";
import { GOVERNING_STATEMENT, renderRecordPdf } from "~/server/record-pdf.server";
import { commissioningRecordFixture } from "../support/record-fixture";

// No database here: the record is plain data. It sits with the integration tests because it reads
// the PDF back with Debian's poppler-utils (pdftotext, pdffonts, pdfinfo), as a surveyor's tools would.

let dir: string;
let record: CommissioningRecord;
let digest: string;
let text: string;
let fonts: string;
let info: string;

/** 5 mm in points (72 pt to the inch, 25.4 mm to the inch). */
const MM5 = (5 / 25.4) * 72;

const poppler = (tool: string, ...args: string[]) =>
  execFileSync(tool, args, { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), "sternpost-record-"));
  record = commissioningRecordFixture();
  // A character the font has no glyph for, in a note: it must come out in a form it has.
  const bearing = record.checklists[0].responses["stern-bearing"].value as { note: string };
  bearing.note += " Bilge checked for CO₂ extinguisher discharge: none.";
  // The seal type first entered as a lip seal, then corrected: an earlier value worth printing.
  const [shaft, alignment] = record.checklists;
  const seal = shaft.responses["seal-type"];
  shaft.history["seal-type"] = [
    { rev: 1, value: { option: "lip-seal" }, by: seal.by, at: seal.at },
    { ...shaft.history["seal-type"][0], rev: 2 },
  ];
  seal.rev = 2;
  // An optional photo item left part-done (one photo of the two it asks for).
  const photoItem = alignment.template.sections
    .flatMap((section) => section.items)
    .find((item) => item.key === "alignment-photo");
  if (photoItem?.kind !== "photo") throw new Error("the alignment template has no alignment-photo item");
  photoItem.minPhotos = 2;
  alignment.responses["alignment-photo"] = {
    value: { photos: [{ id: "9d0e1f2a-3b4c-4d5e-8f60-718293a4b5c6", sha256: "0".repeat(64) }] },
    rev: 1,
    by: alignment.submittedBy!,
    at: alignment.submittedAt!,
  };
  // Stored out of the order of work: the record shows them in it.
  record.checklists = [alignment, shaft];
  digest = recordDigest(record);
  const pdf = await renderRecordPdf(record, { digest, verifyUrl: record.verifyUrl });
  const file = join(dir, "record.pdf");
  writeFileSync(file, pdf);
  text = poppler("pdftotext", "-layout", "-enc", "UTF-8", file, "-");
  fonts = poppler("pdffonts", file);
  info = poppler("pdfinfo", file);
}, 60_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("the commissioning record PDF", () => {
  test("parses as an A4 PDF of several pages", () => {
    expect(info).toMatch(/Page size:\s+595\.28 x 841\.89 pts \(A4\)/);
    expect(Number(/Pages:\s+(\d+)/.exec(info)?.[1])).toBeGreaterThan(3);
    expect(info).toMatch(/Title:\s+Commissioning record: Tern of Helvick/);
  });

  test("embeds the Atkinson Hyperlegible regular and bold faces, and no other font", () => {
    const rows = fonts
      .split("\n")
      .slice(2)
      .filter((line) => line.trim());
    expect(rows.map((row) => row.split(/\s+/)[0].replace(/^[A-Z]{6}\+/, "")).sort()).toEqual([
      "AtkinsonHyperlegible-Bold",
      "AtkinsonHyperlegible-Regular",
    ]);
    // pdffonts columns: name, type (two words), encoding, emb, sub, uni, object, generation.
    for (const row of rows) expect(row).toMatch(/CID TrueType\s+Identity-H\s+yes\s+yes\s+yes/);
  });

  test("names the yard, the vessel and the installed equipment", () => {
    for (const words of [
      "Kittiwake Slip",
      "Tern of Helvick",
      "KSL31007F405",
      "Declan Ó Briain",
      "D480-0041977",
      "2.47 : 1",
      "Róisín Keohane",
    ]) {
      expect(text).toContain(words);
    }
  });

  test("carries the record's digest, each checklist's digest and the verification link", () => {
    expect(digest).toMatch(/^[0-9a-f]{64}$/);
    expect(text).toContain(digest);
    for (const checklist of record.checklists) expect(text).toContain(checklist.digest);
    expect(text).toContain(record.verifyUrl);
  });

  test("writes every moment on the yard's clock and names the zone (issue 16: one formatter, the yard's zone)", async () => {
    // The same record, for a yard in Auckland (UTC+12 in May): the second straightening set, taken
    // in the UTC morning of 12 May, reads that evening there, and the zone is named beside it.
    const utcTime = /Attempt 2 of 3 · values in in · Niamh Forde, 12 May 2025, (\d\d):(\d\d) UTC/.exec(text);
    expect(utcTime).not.toBeNull();
    const file = join(dir, "auckland.pdf");
    writeFileSync(
      file,
      await renderRecordPdf(record, { digest, verifyUrl: record.verifyUrl, timeZone: "Pacific/Auckland" }),
    );
    const auckland = poppler("pdftotext", "-layout", "-enc", "UTF-8", file, "-");
    const hour = String(Number(utcTime![1]) + 12).padStart(2, "0");
    expect(auckland).toContain(
      `Attempt 2 of 3 · values in in · Niamh Forde, 12 May 2025, ${hour}:${utcTime![2]} GMT+12`,
    );
    expect(auckland).not.toMatch(/\d\d:\d\d UTC/);
  });

  test("shows the readings of every attempt, with who took them and when", () => {
    // The second straightening set, mid-length at 180° (an earlier attempt, kept in the record).
    expect(text).toMatch(/Attempt 2 of 3 · values in in · Niamh Forde, 12 May 2025, \d\d:\d\d UTC/);
    expect(text).toMatch(/Mid-length\s+0\s+0\.0015\s+0\.0035\s+0\.002/);
    // A measure entered in thousandths, shown as entered and in the rule's unit.
    expect(text).toMatch(/2\.4 thou\s+0\.0024 in/);
    // A face-gap set in thou, then the computed angularity with its verdict.
    expect(text).toMatch(/Gap\s+5\s+3\.5\s+4\.5\s+4/);
  });

  test("gives each verdict in words, with the rule and the corrective action", () => {
    expect(text).toContain("Outside limit, corrective action recorded");
    expect(text).toMatch(/Rule: between 0 in and 0\.002 in/);
    expect(text).toContain("Corrective action: Spigot runout is in the supplied coupling itself");
    expect(text).toContain("Failed, action recorded");
    // "Failed" before its note was written says nothing the current entry does not.
    expect(text).not.toContain("Earlier, revision 1: Failed");
    expect(text).toContain("Earlier, revision 1: Lip seal (Niamh Forde");
    expect(text).toContain("Within limit");
  });

  test("includes computed results, their diagrams, comments and photo digests", () => {
    expect(text).toMatch(/worst TIR\s+0\.0015 in/);
    expect(text).toContain("Runout along the shaft"); // drawn by the diagram component
    expect(text).toContain("Review comment, Róisín Keohane");
    for (const photo of record.checklists.flatMap((c) => c.photos)) expect(text).toContain(photo.sha256);
  });

  test("puts the checklists in the order the work is done", () => {
    const shaftAt = text.indexOf("CHECKLIST 1 OF 2");
    expect(text.slice(shaftAt, shaftAt + 200)).toContain("Propeller shaft");
    expect(text.indexOf("CHECKLIST 2 OF 2")).toBeGreaterThan(shaftAt);
  });

  test("does not count an optional item left part-done as unresolved", () => {
    expect(text).not.toMatch(/unresolved/);
  });

  test("leaves no page but the last half blank, even when the cover spills over (measured with pdftotext -bbox)", async () => {
    // Eight checklists: the cover's table of them no longer fits on page 1.
    const eight = {
      ...record,
      checklists: [...record.checklists, ...record.checklists, ...record.checklists, ...record.checklists],
    };
    const file = join(dir, "eight.pdf");
    writeFileSync(file, await renderRecordPdf(eight, { digest, verifyUrl: record.verifyUrl }));
    const pages = poppler("pdftotext", "-bbox", file, "-").split("<page ").slice(1);
    // The body of an A4 page between the 66 pt margins (the running header and footer are outside it).
    const top = 66;
    const bottom = 841.89 - 66;
    const used = pages.slice(0, -1).map((page) => {
      const lowest = Math.max(
        ...[...page.matchAll(/yMax="([\d.]+)"/g)]
          .map((m) => Number(m[1]))
          .filter((y) => y > top && y < bottom),
      );
      return Math.round(((lowest - top) / (bottom - top)) * 100);
    });
    expect(used.filter((percent) => percent < 50)).toEqual([]);
  }, 30_000);

  test("writes a character the font lacks in a form it has", () => {
    expect(text).toContain("CO2 extinguisher");
  });

  test("says on every page what governs, with the record id and the page number", () => {
    const pages = text.split("\f").filter((page) => page.trim());
    const statementStart = GOVERNING_STATEMENT.slice(0, 40);
    pages.forEach((page, i) => {
      expect(page).toContain(statementStart);
      expect(page).toContain(`Record ${record.record.id}`);
      expect(page).toContain(`Page ${i + 1} of ${pages.length}`);
    });
  });

  test("keeps every word inside the side margins and off the last 5 mm of the paper", () => {
    const file = join(dir, "record.pdf");
    const boxes = poppler("pdftotext", "-bbox", file, "-");
    const words = [
      ...boxes.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">/g),
    ];
    expect(words.length).toBeGreaterThan(1000);
    for (const [, xMin, yMin, xMax, yMax] of words) {
      // Words inside the 56 pt side margins; header and footer in the top and bottom margins.
      expect(Number(xMin)).toBeGreaterThanOrEqual(55);
      expect(Number(xMax)).toBeLessThanOrEqual(595.28 - 55);
      expect(Number(yMin)).toBeGreaterThanOrEqual(MM5);
      expect(Number(yMax)).toBeLessThanOrEqual(841.89 - MM5);
    }
  });
});
