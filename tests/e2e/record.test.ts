import { randomUUID } from "node:crypto";
import { execFileSync } from "node:child_process";
import { writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { connect } from "../../db/connect.ts";
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { expectNoConsoleErrors, launch, open, signIn, tabletContext } from "../support/browser.ts";
import { publishTemplate } from "../support/fixtures.ts";
import { waitForMail } from "../support/mail.ts";

let browser: Browser;
const knex = connect(process.env.E2E_DATABASE_URL!);
let jobId: number;

// A short checklist for this test only, so the whole path fits in one run.
const template = {
  key: "handover-check",
  version: 1,
  title: "Handover check",
  purpose: "A short end-to-end checklist.",
  sections: [
    {
      key: "main",
      title: "Main",
      items: [
        { kind: "check", key: "bilge-dry", label: "Bilge dry after the run", required: true },
        {
          kind: "measure",
          key: "face-runout",
          label: "Coupling face runout after facing",
          unit: "in",
          accepts: ["in", "mm"],
          rule: { max: 0.002, unit: "in" },
          required: true,
        },
        { kind: "text", key: "remarks", label: "Remarks", required: true },
      ],
    },
  ],
};

beforeAll(async () => {
  browser = await launch();
  const versionId = await publishTemplate(knex, template);
  const lead = (await knex("users").where({ email: "lead2@kittiwake-slip.example" }).first())!;
  const tech = (await knex("users").where({ email: "tech2@kittiwake-slip.example" }).first())!;
  // A hull of its own, so other tests' "Merrow" and "Tern of Helvick" links stay unique.
  const [vesselId] = await knex("vessels").insert({
    name: "Fulmar Rock",
    hin: "KSB30419L526",
    length_value: 28,
    length_unit: "ft",
    length_m: 8.534,
    hull_type: "displacement",
    owner_name: "Ines Mallory",
  });
  const vessel = { id: vesselId };
  [jobId] = await knex("jobs").insert({
    vessel_id: vessel.id,
    scope: "realignment",
    status: "underway",
    engine_model: "R4-110 diesel",
    engine_serial: "R4N-E2E",
    rated_power_hp: 110,
    rated_rpm_min: 2500,
    rated_rpm_max: 2600,
    gear_ratio: 2.5,
    prop_diameter_in: 20,
    prop_pitch_in: 14,
    prop_blades: 3,
    shaft_diameter_in: 1.25,
    shaft_material: "316 stainless",
    coupling_type: "Solid",
    lead_id: lead.id,
  });
  await knex("job_technicians").insert({ job_id: jobId, user_id: tech.id });
  await knex("job_checklists").insert({
    id: randomUUID(),
    job_id: jobId,
    template_version_id: versionId,
    template_key: template.key,
    started_by: lead.id,
  });
});
afterAll(async () => {
  await browser?.close();
  await knex.destroy();
});

const item = (page: Page, key: string) => page.locator(`[data-item="${key}"]`);
const state = async () => (await knex("job_checklists").where({ job_id: jobId }).first())!.state;

describe("from submission to the surveyor's verified PDF", () => {
  it("submit, return with a comment, fix, countersign, issue, download, verify", async () => {
    // The technician fills it in and submits.
    const tech = await tabletContext(browser);
    const techPage = await tech.context.newPage();
    await signIn(techPage, "tech2@kittiwake-slip.example");
    await techPage.getByRole("button", { name: /Make my jobs available offline/ }).click();
    await techPage
      .getByTestId("offline-readiness")
      .getByText(/Ready offline/)
      .waitFor();
    await techPage.getByRole("link", { name: /^Handover check/ }).click();
    await techPage.getByRole("heading", { level: 1, name: "Handover check" }).waitFor();
    expect(await techPage.getByTestId("submit-panel").innerText()).toMatch(/Bilge dry after the run/);
    await item(techPage, "bilge-dry").getByRole("button", { name: "✓ Pass" }).click();
    await item(techPage, "face-runout").getByLabel("Reading").fill("0.0015");
    await item(techPage, "face-runout").getByRole("button", { name: "Record reading" }).click();
    await item(techPage, "remarks").getByRole("textbox").fill("Couplings faced, bolts torqued");
    await item(techPage, "remarks").getByRole("button", { name: "Save" }).click();
    await techPage.getByRole("button", { name: "Submit for review" }).click();
    await expect.poll(() => techPage.locator("h1 + p").innerText()).toMatch(/Waiting for review/);
    await expect.poll(state, { timeout: 20_000 }).toBe("submitted");

    // The lead returns it with a comment.
    const lead = await tabletContext(browser);
    const leadPage = await lead.context.newPage();
    await signIn(leadPage, "lead2@kittiwake-slip.example");
    await open(leadPage, `/jobs/${jobId}`);
    await leadPage.getByRole("link", { name: "Review" }).click();
    await leadPage.getByRole("heading", { name: /Review: Handover check/ }).waitFor();
    // Every entry is within its limits, so the items are folded away until opened.
    await leadPage.getByTestId("within-limits").getByText("3 items within limits").click();
    await item(leadPage, "remarks")
      .getByLabel("Comment on this item")
      .fill("Say which bolts and the torque used");
    await item(leadPage, "remarks").getByRole("button", { name: "Add comment" }).click();
    await item(leadPage, "remarks").getByTestId("review-comment").waitFor();
    // Returning asks once more, saying what the technician will get.
    await leadPage.getByText(/Return to the technician/).click();
    await leadPage.getByText(/gets it back with your 1 comment/).waitFor();
    expect(await state()).toBe("submitted");
    await leadPage.getByRole("button", { name: "Yes, return it" }).click();
    await leadPage.waitForURL(new RegExp(`/jobs/${jobId}$`));
    expect(await state()).toBe("returned");

    // The technician sees the comment at the item, fixes it and submits again.
    await open(techPage, "/");
    await techPage.getByRole("button", { name: /Refresh the offline copy/ }).click();
    await techPage
      .getByTestId("offline-readiness")
      .getByText(/Ready offline/)
      .waitFor();
    // Today shows what came back, with the comment; it opens the checklist.
    const returned = techPage.getByTestId("returned-queue");
    await returned.getByText("Say which bolts and the torque used").waitFor();
    await returned.getByRole("link", { name: /Handover check/ }).click();
    await item(techPage, "remarks")
      .getByTestId("review-comment")
      .getByText(/torque used/)
      .waitFor();
    // The entry's box comes first; the box below the comment answers the lead.
    await item(techPage, "remarks")
      .getByRole("textbox")
      .first()
      .fill("Couplings faced; four M12 bolts at 85 N·m");
    await item(techPage, "remarks").getByRole("button", { name: "Save" }).click();
    await techPage.getByRole("button", { name: "Submit for review" }).click();
    await expect.poll(state, { timeout: 20_000 }).toBe("submitted");

    // The lead countersigns with the password (a wrong one is refused first).
    await open(
      leadPage,
      `/checklists/${(await knex("job_checklists").where({ job_id: jobId }).first())!.id}/review`,
    );
    await leadPage.getByLabel("Your password, to countersign").fill("not-my-password");
    await leadPage.getByRole("button", { name: "Countersign and lock" }).click();
    await leadPage
      .getByRole("alert")
      .getByText(/password is not right/)
      .waitFor();
    await leadPage.getByLabel("Your password, to countersign").fill("slipway-demo-2026");
    await leadPage.getByRole("button", { name: "Countersign and lock" }).click();
    await leadPage.waitForURL(new RegExp(`/jobs/${jobId}$`));
    const signed = (await knex("job_checklists").where({ job_id: jobId }).first())!;
    expect(signed.state).toBe("countersigned");
    expect(signed.digest).toMatch(/^[0-9a-f]{64}$/);

    // The manager issues the record to a new surveyor.
    const manager = await tabletContext(browser);
    const managerPage = await manager.context.newPage();
    await signIn(managerPage, "manager@kittiwake-slip.example");
    await open(managerPage, `/jobs/${jobId}`);
    const surveyorEmail = `nessa.quick.${Date.now()}@harbourmark-survey.example`;
    await managerPage.getByLabel("Surveyors' e-mail addresses").fill("not an address");
    await managerPage.getByRole("button", { name: "Issue the record" }).click();
    await managerPage
      .getByRole("alert")
      .getByText(/not an e-mail address/)
      .waitFor();
    // A new surveyor needs a name to be greeted by.
    await managerPage.getByLabel("Surveyors' e-mail addresses").fill(surveyorEmail);
    await managerPage.getByRole("button", { name: "Issue the record" }).click();
    await managerPage
      .getByRole("alert")
      .getByText(/Give the name of each new surveyor/)
      .waitFor();
    await managerPage.getByLabel("Surveyors' e-mail addresses").fill(`Nessa Quick <${surveyorEmail}>`);
    await managerPage.getByRole("button", { name: "Issue the record" }).click();
    await managerPage
      .getByRole("status")
      .getByText(/Record issued/)
      .waitFor();

    // The e-mail arrives with the links; the surveyor is greeted by name, told who invited them and
    // why, sets a password and lands, signed in, on the record they were sent.
    const mail = await waitForMail(surveyorEmail);
    expect(mail.text).toMatch(/^Hello Nessa Quick,/);
    const invitation = mail.text.match(/https?:\/\/\S+\/invitation\/\S+/)![0];
    const recordUrl = mail.text.match(/https?:\/\/\S+\/records\/[0-9a-f-]{36}/)![0];
    const jsonUrl = mail.text.match(/https?:\/\/\S+\/records\/[0-9a-f-]{36}\/json/)![0];
    const verifyUrl = mail.text.match(/https?:\/\/\S+\/verify\/[0-9a-f-]{36}/)![0];
    const surveyor = await tabletContext(browser);
    const surveyorPage = await surveyor.context.newPage();
    await open(surveyorPage, invitation);
    await surveyorPage.getByRole("heading", { name: "Welcome, Nessa Quick" }).waitFor();
    expect(await surveyorPage.getByTestId("invitation-why").innerText()).toMatch(
      /Kittiwake Slip has issued you the commissioning record of Fulmar Rock \(R4-110 diesel\)/,
    );
    await surveyorPage.getByLabel("New password").fill("surveyor-password-1");
    await surveyorPage.getByLabel("Type it again").fill("surveyor-password-1");
    await surveyorPage.getByRole("button", { name: "Set password" }).click();
    await surveyorPage.waitForURL(new URL(recordUrl).href);
    await surveyorPage
      .getByTestId("record-checklist")
      .getByText(/countersigned by/)
      .waitFor();
    // Everything else stays closed to the surveyor.
    expect((await surveyorPage.request.get(`/jobs/${jobId}`)).status()).toBe(403);
    expect((await surveyorPage.request.get(`/checklists/${signed.id}`)).status()).toBe(403);

    const download = surveyorPage.waitForEvent("download");
    await surveyorPage.getByRole("link", { name: "Download the PDF" }).click();
    const pdfPath = path.join(tmpdir(), `record-${Date.now()}.pdf`);
    await (await download).saveAs(pdfPath);
    const text = execFileSync("pdftotext", ["-layout", pdfPath, "-"], { encoding: "utf8" });
    const digest = (await knex("records").where({ job_id: jobId }).first())!.digest;
    expect(text).toContain("Fulmar Rock");
    expect(text).toMatch(/0\.0015/);
    expect(text.replace(/\s+/g, "")).toContain(digest);

    // The same record as JSON, beside the PDF: its digest is the SHA-256 of the RFC 8785 form of
    // its signedContent (docs/record-json.md), and it matches the issued record's.
    const asJson = await surveyorPage.request.get(new URL(jsonUrl).pathname);
    expect(asJson.status()).toBe(200);
    const json = await asJson.json();
    expect(json.digest.value).toBe(digest);
    expect(createHash("sha256").update(canonicalize(json.signedContent)!, "utf8").digest("hex")).toBe(digest);
    expect(
      json.checklists[0].items.find((i: { key: string }) => i.key === "face-runout").verdict.status,
    ).toBe("ok");
    await surveyorPage.getByRole("link", { name: "Download as data (JSON)" }).waitFor();
    // Same access as the PDF: no one signed in, no JSON.
    expect(
      (
        await (
          await tabletContext(browser)
        ).context.request.get(new URL(jsonUrl).pathname, { maxRedirects: 0 })
      ).status(),
    ).toBe(302);

    // The public verification page: genuine, then changed after a direct edit of the stored record.
    const visitor = await (await tabletContext(browser)).context.newPage();
    await open(visitor, new URL(verifyUrl).pathname);
    expect(await visitor.getByTestId("verdict").innerText()).toMatch(/Genuine and unchanged/);
    // It names what a reader matches to the paper in their hand, and nothing more.
    const identity = await visitor.getByTestId("verify-identity").innerText();
    for (const words of ["Kittiwake Slip", "Fulmar Rock", "KSB30419L526", "R4-110 diesel", "R4N-E2E"])
      expect(identity).toContain(words);
    const signers = await visitor.getByTestId("verify-checklists").innerText();
    expect(signers).toMatch(/Handover check version 1/);
    expect(signers).toMatch(/submitted by Wren Malloch on/);
    expect(signers).toMatch(/Countersigned by Sunniva Craddock, the job's lead, on/);
    const everything = await visitor.locator("main").innerText();
    expect(everything).not.toContain("0.0015");
    expect(everything).not.toContain("@");
    const stored = (await knex("records").where({ job_id: jobId }).first())!;
    await knex("records")
      .where({ id: stored.id })
      .update({ content: stored.content.replace("0.0015", "0.0009") });
    await open(visitor, new URL(verifyUrl).pathname);
    expect(await visitor.getByTestId("verdict").innerText()).toMatch(/Changed/);
    await knex("records").where({ id: stored.id }).update({ content: stored.content });

    expectNoConsoleErrors(tech.errors);
    expectNoConsoleErrors(lead.errors);
    writeFileSync(path.join(tmpdir(), "last-record.txt"), text);
  });
});
