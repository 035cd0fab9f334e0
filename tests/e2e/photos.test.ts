import { createHash } from "node:crypto";
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import type { Browser, Locator, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import {
  expectNoConsoleErrors,
  goOfflineReady,
  hydrated,
  launch,
  open,
  signIn,
  tabletContext,
} from "../support/browser.ts";
import { makeCrewedJob, TEST_PASSWORD } from "../support/fixtures.ts";
import { gradientPng } from "../unit/photos/images.ts";

let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
const HULL = "Guillemot of Ard";
/** This file's own hull, crew and alignment checklist. */
let crew: Awaited<ReturnType<typeof makeCrewedJob>>;
beforeAll(async () => {
  browser = await launch();
  crew = await makeCrewedJob(knex, HULL, ["engine-alignment"]);
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

const parse = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v);
const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

async function openAlignmentPhotos(page: Page): Promise<Locator> {
  await page.getByRole("link", { name: "Today" }).click();
  const job = page.locator('[data-testid^="job-"]').filter({ hasText: HULL });
  await job.getByRole("link", { name: /^Engine alignment/ }).click();
  await page.getByRole("heading", { level: 1, name: "Engine alignment" }).waitFor();
  await page.getByRole("button", { name: /^4\. Fasteners locked/ }).click();
  return page.locator('[data-item="alignment-photo"]');
}

/** Every thumbnail of the item has loaded a picture (not just its alt text). */
async function picturesShown(item: Locator): Promise<number> {
  const images = item.getByTestId("photo").locator("img");
  const sizes = await images.evaluateAll((all) =>
    all.map((img) => ((img as HTMLImageElement).complete ? (img as HTMLImageElement).naturalWidth : 0)),
  );
  return sizes.filter((w) => w > 0).length;
}

async function alignmentPhotoValue() {
  const row = await knex("checklist_responses")
    .where({ checklist_id: crew.checklists["engine-alignment"]!, item_key: "alignment-photo" })
    .first("value");
  return row ? (parse(row.value) as { photos: { id: string; sha256: string }[] }) : undefined;
}

describe("photos taken with no connection", () => {
  it("are kept on the tablet through a reload, reach the store when the connection returns, and the lead sees them", async () => {
    const tablet = await tabletContext(browser);
    const page = await tablet.context.newPage();
    await signIn(page, crew.technician.email, TEST_PASSWORD);
    await goOfflineReady(page);
    // Two real pictures: a PNG built from its bytes, and a JPEG drawn and encoded by Chromium itself.
    const png = gradientPng(120, 90, 3);
    const jpegUrl = await page.evaluate(() => {
      const canvas = document.createElement("canvas");
      canvas.width = 320;
      canvas.height = 240;
      const g = canvas.getContext("2d")!;
      g.fillStyle = "#1e4e79";
      g.fillRect(0, 0, 320, 240);
      g.fillStyle = "#9c4221";
      g.fillRect(60, 50, 150, 110);
      return canvas.toDataURL("image/jpeg", 0.9);
    });
    const jpeg = Buffer.from(jpegUrl.split(",")[1]!, "base64");

    await tablet.context.setOffline(true);
    const photos = await openAlignmentPhotos(page);
    await photos
      .getByLabel("Take or add a photo")
      .setInputFiles({ name: "coupling.png", mimeType: "image/png", buffer: png });
    await photos.getByTestId("photo-count").getByText("1 photo · at least 1 needed").waitFor();
    await photos
      .getByLabel("Take or add another photo")
      .setInputFiles({ name: "mount.jpg", mimeType: "image/jpeg", buffer: jpeg });
    await photos.getByTestId("photo-count").getByText("2 photos · at least 1 needed").waitFor();
    // A third, taken by mistake and removed again before submitting.
    await photos
      .getByLabel("Take or add another photo")
      .setInputFiles({ name: "blurred.png", mimeType: "image/png", buffer: gradientPng(60, 40, 9) });
    await photos.getByTestId("photo-count").getByText("3 photos · at least 1 needed").waitFor();
    await photos.getByRole("button", { name: "Remove photo 3" }).click();
    await photos.getByRole("button", { name: "Remove it" }).click();
    await photos.getByTestId("photo-count").getByText("2 photos · at least 1 needed").waitFor();
    await expect.poll(() => picturesShown(photos)).toBe(2);
    expect(await photos.getByTestId("photo-state").allInnerTexts()).toEqual([
      "On this tablet · waiting to send",
      "On this tablet · waiting to send",
    ]);
    expect(await alignmentPhotoValue()).toBeUndefined();

    // Close the tab and open the app again, still offline: the photos come from the tablet.
    await page.close();
    const again = await tablet.context.newPage();
    expect((await again.goto("/"))?.fromServiceWorker()).toBe(true);
    await hydrated(again);
    const reopened = await openAlignmentPhotos(again);
    await expect.poll(() => picturesShown(reopened)).toBe(2);

    // The connection returns: the entry goes first, then both photos, and the tablet says so.
    await tablet.context.setOffline(false);
    await expect
      .poll(() => again.getByTestId("waiting").innerText(), { timeout: 20_000 })
      .toBe("All entries sent");
    await expect
      .poll(() => reopened.getByTestId("photo-state").allInnerTexts(), { timeout: 20_000 })
      .toEqual(["Sent", "Sent"]);
    const value = await alignmentPhotoValue();
    expect(value?.photos).toHaveLength(2);
    for (const photo of value!.photos) {
      const served = await again.request.get(`/api/photos/${photo.id}`);
      expect(served.status()).toBe(200);
      // Compressed on the tablet to JPEG; the bytes served are the ones the entry's SHA-256 names.
      expect(served.headers()["content-type"]).toBe("image/jpeg");
      expect(sha256(await served.body())).toBe(photo.sha256);
      expect((await knex("photos").where({ id: photo.id }).first("sha256"))?.sha256).toBe(photo.sha256);
    }
    // The removed photo reaches the store too: the item's history lists it.
    const history = await knex("response_history")
      .where({ checklist_id: crew.checklists["engine-alignment"]!, item_key: "alignment-photo" })
      .pluck("value");
    const everListed = new Set(
      history.flatMap((v) => (parse(v) as { photos: { id: string }[] }).photos.map((p) => p.id)),
    );
    expect(everListed.size).toBe(3);
    await expect
      .poll(
        () =>
          knex("photos")
            .whereIn("id", [...everListed])
            .count({ n: "*" })
            .then(([r]) => Number(r!.n)),
        { timeout: 20_000 },
      )
      .toBe(3);
    // After the confirmation the small copy still shows the photos on this tablet.
    await again.reload();
    await hydrated(again);
    const afterUpload = await openAlignmentPhotos(again);
    await expect.poll(() => picturesShown(afterUpload)).toBe(2);
    expectNoConsoleErrors(tablet.errors.filter((e) => !/ERR_INTERNET_DISCONNECTED/.test(e)));
    await tablet.context.close();

    // The lead, on another tablet, sees them from the server.
    const leadTablet = await tabletContext(browser);
    const lead = await leadTablet.context.newPage();
    await signIn(lead, crew.lead.email, TEST_PASSWORD);
    const seen = await openAlignmentPhotos(lead);
    await seen.getByTestId("photo-count").getByText("2 photos · at least 1 needed").waitFor();
    await expect.poll(() => picturesShown(seen)).toBe(2);
    const sources = await seen
      .getByTestId("photo")
      .locator("img")
      .evaluateAll((all) => all.map((img) => img.getAttribute("src")));
    expect(sources).toEqual(value!.photos.map((p) => `/api/photos/${p.id}`));
    expectNoConsoleErrors(leadTablet.errors);
    await leadTablet.context.close();
  });
});

describe("a photo whose upload the tablet never heard back from", () => {
  it("arrives once: the page closed mid-upload and reopened leaves one row and one stored object", async () => {
    const other = await makeCrewedJob(knex, "Shearwater of Tarn", ["engine-alignment"]);
    const checklistId = other.checklists["engine-alignment"]!;
    const tablet = await tabletContext(browser);
    const page = await tablet.context.newPage();
    await signIn(page, other.technician.email, TEST_PASSWORD);
    await goOfflineReady(page);

    await tablet.context.setOffline(true);
    await page.getByRole("link", { name: "Today" }).click();
    await page
      .locator('[data-testid^="job-"]')
      .filter({ hasText: "Shearwater of Tarn" })
      .getByRole("link", { name: /^Engine alignment/ })
      .click();
    await page.getByRole("heading", { level: 1, name: "Engine alignment" }).waitFor();
    await page.getByRole("button", { name: /^4\. Fasteners locked/ }).click();
    const photos = page.locator('[data-item="alignment-photo"]');
    await photos
      .getByLabel("Take or add a photo")
      .setInputFiles({ name: "coupling.png", mimeType: "image/png", buffer: gradientPng(90, 60, 5) });
    await photos.getByTestId("photo-count").getByText("1 photo · at least 1 needed").waitFor();

    // Online again: the upload goes out and reaches the server, but the page is closed before the
    // answer arrives (the tablet was switched off mid-upload), so the tablet still holds it as waiting.
    let reachedServer!: () => void;
    const uploaded = new Promise<void>((resolve) => (reachedServer = resolve));
    await page.route("**/api/photos/**", async (route) => {
      if (route.request().method() !== "PUT") return route.continue();
      const answer = await route.fetch();
      expect(answer.status()).toBe(201);
      reachedServer();
      // No answer reaches the page: it is closed below while this request is still open.
    });
    await tablet.context.setOffline(false);
    await uploaded;
    await page.close();
    const stored = await knex("photos").where({ checklist_id: checklistId });
    expect(stored).toHaveLength(1);

    // Opened again: the tablet sends the photo again and the server answers "already stored".
    const again = await tablet.context.newPage();
    await open(again, "/");
    await again.getByRole("link", { name: "Today" }).click();
    await again
      .locator('[data-testid^="job-"]')
      .filter({ hasText: "Shearwater of Tarn" })
      .getByRole("link", { name: /^Engine alignment/ })
      .click();
    await again.getByRole("button", { name: /^4\. Fasteners locked/ }).click();
    const reopened = again.locator('[data-item="alignment-photo"]');
    await expect
      .poll(() => reopened.getByTestId("photo-state").allInnerTexts(), { timeout: 20_000 })
      .toEqual(["Sent"]);

    // Exactly one copy: one row, one object in the store under the photo's SHA-256.
    const rows = await knex("photos").where({ checklist_id: checklistId });
    expect(rows).toHaveLength(1);
    expect(rows[0].id).toBe(stored[0].id);
    const s3 = new S3Client({
      endpoint: `http://127.0.0.1:${process.env.E2E_S3_PORT ?? 4669}`,
      region: "us-east-1",
      forcePathStyle: true,
      credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
    });
    const listed = await s3.send(
      new ListObjectsV2Command({
        Bucket: "sternpost-photos",
        Prefix: `photos/sha256/${rows[0].sha256.slice(0, 2)}/`,
      }),
    );
    expect((listed.Contents ?? []).filter((o) => o.Key!.endsWith(rows[0].sha256))).toHaveLength(1);
    const value = await knex("checklist_responses")
      .where({ checklist_id: checklistId, item_key: "alignment-photo" })
      .first("value");
    expect((parse(value?.value) as { photos: { id: string }[] }).photos.map((p) => p.id)).toEqual([
      rows[0].id,
    ]);
    expectNoConsoleErrors(tablet.errors.filter((e) => !/ERR_INTERNET_DISCONNECTED/.test(e)));
    await tablet.context.close();
  });
});
