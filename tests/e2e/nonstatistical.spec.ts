import { execFileSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { PlanSamplePage, SamplePage } from "./pages/samples-pages";
import { ReviewPanelPage } from "./pages/review-panel";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });
const SAMPLE_NAME = "Receivables cut-off — e2e nonstatistical";

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

test("a senior plans a nonstatistical sample from the risk assessment, picks items haphazardly, keys results; a manager locks it and reads the PDF", async ({
  page,
}) => {
  test.setTimeout(300_000);
  await page.setViewportSize({ width: 1440, height: 1000 });
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 240,
    seed: 1503,
    name: "Receivables for the cut-off test",
  });
  const largest = (
    await (
      await page.request.get(
        `/api/engagements/${engagementId}/populations/${population.id}/items?sort=book&dir=desc&pageSize=10`,
      )
    ).json()
  ).items as { itemRef: string; bookValue: string }[];
  const tolerable = (Number(population.total) / 4).toFixed(2);

  // Plan on screen: the two risks map to a factor; block selection is refused with its reason.
  await page.goto(`/engagements/${engagementId}`);
  const plan = new PlanSamplePage(page);
  await plan.openFromEngagement();
  await plan.describe({
    populationId: population.id,
    name: SAMPLE_NAME,
    objective: "Test that recorded invoices relate to goods delivered before the period end.",
    assertion: "Cut-off",
    direction: "overstatement",
  });
  await plan.method("Nonstatistical, key items and a projected misstatement");
  await plan.field("Assessed risk of material misstatement").selectOption({ label: "Maximum" });
  await plan.field("Risk other substantive procedures fail to detect").selectOption({ label: "Moderate" });
  await plan.field(/Tolerable misstatement/).fill(tolerable);
  await plan.field(/Key-item threshold/).fill(largest[2].bookValue);
  await page.getByRole("button", { name: "Add a key item by reference" }).click();
  await plan.field("Key item 1: reference").fill(largest[3].itemRef);
  await plan.field("Key item 1: why it is examined in full").fill("Invoiced on the last day of the period");
  await expect(page.getByTestId("risk-mapping")).toContainText("assurance factor 2.30");
  await expect(page.getByTestId("key-items-summary")).toContainText("4 key items");
  await plan.field("Selection of the rest").selectOption({ label: "Block of contiguous items" });
  await expect(plan.sizePanel()).toContainText("rarely representative");
  await shot(page, "1-block-refused");
  await plan.field("Selection of the rest").selectOption({ label: "Haphazard (picked by the auditor)" });
  await expect(
    plan.sizePanel().getByText("n = ⌈(BV − key items' BV) ÷ TM × assurance factor⌉", { exact: false }),
  ).toBeVisible();
  await expect(plan.sizePanel()).toContainText("Haphazard selection: the auditor picks");
  await expect(plan.sizePanel()).not.toContainText("rarely representative");
  const size = Number(await plan.chosenSize().textContent());
  expect(size).toBeGreaterThan(3);
  await shot(page, "2-plan-from-risks");
  await plan.save();
  await expect(page.getByRole("heading", { name: SAMPLE_NAME })).toBeVisible();
  const url = new URL(page.url()).pathname;
  const base = `/api${url}`;

  // Draw (the key items), then pick the rest on the population grid.
  const sample = new SamplePage(page);
  await sample.draw();
  await expect(page.getByTestId("draw-seed")).toContainText("haphazard");
  const picker = page.getByTestId("haphazard-picker");
  await expect(picker).toBeVisible();
  for (let n = 1; n <= size; n++) {
    await picker
      .getByRole("button", { name: /^Pick / })
      .nth(n % 3)
      .click();
    await expect(page.getByTestId("picks-count")).toContainText(`${n} of ${size}`);
  }
  await expect(picker.getByRole("table", { name: "Haphazard picks" })).toContainText("Priya Nair");
  await shot(page, "3-haphazard-picks");

  // Key results: one misstatement on screen, the rest agreed through the API.
  await sample.open("Results and evaluation");
  const { items } = await (await page.request.get(`${base}/items?pageSize=500`)).json();
  const misstated = items.find((i: { keyItem: boolean; bookValue: string }) => !i.keyItem && Number(i.bookValue) > 100);
  await sample.record(
    misstated.itemRef,
    {
      status: "Done",
      audited: (Number(misstated.bookValue) - 100).toFixed(2),
      cause: "Cut-off",
      comment: "Delivered after the period end",
    },
    "Priya Nair",
  );
  await expect(sample.evaluation()).toContainText("Total projected misstatement");
  for (const it of items.filter((i: { id: number }) => i.id !== misstated.id)) {
    expect(
      (
        await page.request.patch(`${base}/items/${it.id}`, {
          data: { version: it.version, status: "done", auditedValue: it.bookValue },
        })
      ).status(),
    ).toBe(200);
  }
  await page.reload();
  await sample.open("Results and evaluation");
  await expect(page.getByTestId("conclusion")).toContainText("total projected misstatement");
  await expect(sample.evaluation()).toContainText("no statistical bound", { ignoreCase: true });
  await shot(page, "4-evaluation");
  const review = new ReviewPanelPage(page);
  // The auditor's own conclusion and response come before the sign-off (the computed result is not it).
  await review.conclude(
    "The cut-off misstatement found is isolated; with the client's adjustment the balance is not materially misstated.",
    [{ label: "Perform alternative procedures" }],
  );
  await review.signOff("preparer");

  // The manager signs off, locks, and reads the PDF.
  await as(page, "manager");
  await page.goto(url);
  await review.signOff("reviewer");
  await review.lock();
  await expect(page.getByText("Locked — final").first()).toBeVisible();
  await shot(page, "5-locked");
  const pdf = Buffer.from(await (await page.request.get(`${base}/workpaper`)).body());
  const pdfPath = test.info().outputPath("workpaper.pdf");
  fs.writeFileSync(pdfPath, pdf);
  execFileSync("pdftoppm", ["-png", "-r", "60", pdfPath, path.join(test.info().outputDir, "workpaper-page")]);
  const text = execFileSync("pdftotext", [pdfPath, "-"]).toString().replace(/\s+/g, " ");
  expect(text).toContain("Nonstatistical sample");
  expect(text).toContain("Sizing from the risk assessment");
  expect(text).toContain("cannot be re-performed by a seed");
  expect(text).toContain(`Haphazard picks (${size})`);
  expect(text).toContain("Invoiced on the last day of the period");
  expect(text).toContain(misstated.itemRef);
  expect(text).toContain("Total projected misstatement");
  expect(text).not.toContain("DRAFT");
});
