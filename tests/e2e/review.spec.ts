import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { SamplePage } from "./pages/samples-pages";
import { ReviewPanelPage } from "./pages/review-panel";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

test.describe.configure({ mode: "serial" });

const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

const CONCLUSION = "Receivables are not materially overstated; the pricing difference is carried to the summary.";

test("the whole job: results, preparer sign-off, a review note answered and cleared, reviewer sign-off, lock and the PDF", async ({
  page,
}) => {
  test.setTimeout(180_000);
  // Set-up through the API as the senior: a reconciled ledger and a drawn monetary-unit sample.
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 300,
    seed: 77,
    name: "Receivables for review",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables existence (review run)",
      objective: "Confirm recorded receivables exist at the period end.",
      assertion: "Existence",
      direction: "overstatement",
      params: {
        method: "mus",
        confidence: 0.95,
        tolerableMisstatement: (Number(population.positiveTotal) / 6).toFixed(2),
        factorMode: "table",
      },
    },
  });
  expect(planned.status(), await planned.text()).toBe(201);
  const sampleId = (await planned.json()).sample.id as number;
  expect(
    (
      await page.request.post(`/api/engagements/${engagementId}/samples/${sampleId}/draw`, { data: { seed: 20261202 } })
    ).status(),
  ).toBe(201);
  const url = `/engagements/${engagementId}/samples/${sampleId}`;
  const base = `/api${url}`;

  // Staff key in the results: one misstatement through the grid, the rest as agreed.
  await as(page, "staff");
  await page.goto(url);
  const sample = new SamplePage(page);
  await sample.open("Results and evaluation");
  const { items } = await (await page.request.get(`${base}/items?pageSize=200`)).json();
  const misstated = items.find((i: { topStratum: boolean }) => !i.topStratum) ?? items[0];
  const audited = (Number(misstated.bookValue) * 0.75).toFixed(2);
  await sample.record(
    misstated.itemRef,
    { status: "Done", audited, cause: "Pricing or rate", comment: "Price list applied wrongly" },
    "Jonah Lindqvist",
  );
  for (const it of items.filter((i: { id: number }) => i.id !== misstated.id)) {
    const r = await page.request.patch(`${base}/items/${it.id}`, {
      data: { version: it.version, status: "done", auditedValue: it.bookValue },
    });
    expect(r.status()).toBe(200);
  }
  await page.reload();
  await shot(page, "1-staff-results");

  // The senior signs off as preparer.
  await as(page, "senior");
  await page.goto(url);
  const review = new ReviewPanelPage(page);
  // Issue 13 §6: no sign-off before the auditor's own conclusion and response are recorded.
  // The screen matches the server's refusal: the button is disabled and says why beside it.
  const preparerSignOff = page.getByRole("button", { name: "Sign off as preparer" });
  await expect(preparerSignOff).toBeDisabled();
  await expect(preparerSignOff).toHaveAccessibleDescription("Record the auditor's conclusion first.");
  await shot(page, "2a-sign-off-waits-for-conclusion");
  await review.conclude(CONCLUSION, [{ label: "Perform alternative procedures" }]);
  await review.signOff("preparer");
  await shot(page, "2-senior-signed-off");

  // A change after the sign-off clears it, and the screen says so; the senior signs off again.
  await as(page, "staff");
  await page.goto(url);
  await sample.open("Results and evaluation");
  await sample.record(misstated.itemRef, { comment: "Price list applied wrongly; contract checked" });
  await expect(page.getByTestId("sign-offs-cleared")).toBeVisible();
  await expect(page.getByRole("button", { name: "Sign off as preparer" })).toBeVisible(); // staff may sign again
  await expect(page.getByText("not signed").first()).toBeVisible();
  await shot(page, "2b-change-clears-sign-off");
  await as(page, "senior");
  await page.goto(url);
  await review.conclude(CONCLUSION, [{ label: "Perform alternative procedures" }]);
  await review.signOff("preparer");

  // The manager raises a note; the reviewer sign-off waits until it is cleared.
  await as(page, "manager");
  await page.goto(url);
  await review.raiseNote(`Explain the pricing difference on ${misstated.itemRef} and attach the price list.`);
  const reviewerSignOff = page.getByRole("button", { name: "Sign off as reviewer" });
  await expect(reviewerSignOff).toBeDisabled();
  await expect(reviewerSignOff).toHaveAccessibleDescription("Clear the open review note first.");
  await shot(page, "3-manager-raised-note");

  await as(page, "senior");
  await page.goto(url);
  await review.answerNote(1, "The customer's contract price was 25% lower; the credit note is in the evidence.");
  await shot(page, "4-senior-answered");

  await as(page, "manager");
  await page.goto(url);
  await review.clearNote(1);
  await review.signOff("reviewer");
  const sha = await review.lock();
  await expect(page.getByText("Locked — final").first()).toBeVisible();
  await shot(page, "5-manager-locked");

  // The PDF: exactly the stored bytes, turned into PNG pages, its text carrying the sample's numbers.
  const pdfResponse = await page.request.get(`${base}/workpaper`);
  const pdf = Buffer.from(await pdfResponse.body());
  expect(createHash("sha256").update(pdf).digest("hex")).toBe(sha);
  const pdfPath = test.info().outputPath("workpaper.pdf");
  fs.writeFileSync(pdfPath, pdf);
  execFileSync("pdftoppm", ["-png", "-r", "60", pdfPath, path.join(test.info().outputDir, "workpaper-page")]);
  expect(fs.readdirSync(test.info().outputDir).filter((f) => f.startsWith("workpaper-page")).length).toBeGreaterThan(1);
  const text = execFileSync("pdftotext", ["-layout", pdfPath, "-"]).toString();
  const { evaluation } = await (await page.request.get(`${base}/evaluation`)).json();
  const grouped = (v: string) =>
    Number(v).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 });
  expect(text).toContain("20261202");
  expect(text).toContain(misstated.itemRef);
  expect(text).toContain(grouped(evaluation.block.overstatement.upperLimit));
  // The computed result, labelled as Sondage's, apart from the auditor's conclusion with its writer.
  expect(text).toContain("Computed by Sondage");
  expect(text.replace(/\s+/g, " ")).toContain(CONCLUSION);
  expect(text).toContain("Jonah Lindqvist");
  expect(text).toContain("Tomás Reyes");
  expect(text).not.toContain("DRAFT");

  // Locked means read-only, in the API as on screen.
  const write = await page.request.patch(`${base}/items/${misstated.id}`, {
    data: { version: 99, status: "done", auditedValue: "1.00" },
  });
  expect(write.status()).toBe(409);
  expect((await write.json()).error.code).toBe("locked");
  await as(page, "staff");
  await page.goto(url);
  await expect(page.getByRole("status").filter({ hasText: "This sample is locked." })).toBeVisible();
  await shot(page, "6-staff-sees-locked");
});
