import { execFileSync } from "node:child_process";
import fs from "node:fs";
import ExcelJS from "exceljs";
import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { MisstatementsPage } from "./pages/misstatements-page";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

test("a manager opens the summary on the demo engagement, adds a judgemental misstatement, sees the status change and exports the workbook and the PDF", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await page.setViewportSize({ width: 1440, height: 900 });
  // A sample with results feeds the summary: a reconciled ledger, a drawn monetary-unit sample, results through the API.
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 300,
    seed: 1603,
    name: "Receivables for the summary",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables existence (summary run)",
      objective: "Confirm recorded receivables exist.",
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
      await page.request.post(`/api/engagements/${engagementId}/samples/${sampleId}/draw`, { data: { seed: 16 } })
    ).status(),
  ).toBe(201);
  const { items } = await (
    await page.request.get(`/api/engagements/${engagementId}/samples/${sampleId}/items?pageSize=200`)
  ).json();
  for (const [i, it] of items.entries()) {
    const audited = i === 0 ? (Number(it.bookValue) * 0.9).toFixed(2) : it.bookValue;
    expect(
      (
        await page.request.patch(`/api/engagements/${engagementId}/samples/${sampleId}/items/${it.id}`, {
          data: { version: it.version, status: "done", auditedValue: audited },
        })
      ).status(),
    ).toBe(200);
  }

  await as(page, "manager");
  const summary = new MisstatementsPage(page);
  await summary.openFromEngagement(engagementId);
  await expect(page.getByTestId(`summary-row-s${sampleId}-factual`)).toBeVisible();
  await expect(page.getByTestId(`summary-row-s${sampleId}-projected`)).toBeVisible();
  await shot(page, "1-summary-before");

  // An amount that takes the larger total from its present level to just past the approaching threshold (or past overall materiality if already there).
  const before = (await (await page.request.get(`/api/engagements/${engagementId}/misstatements`)).json()).summary;
  const measure = Number(before.status.measure),
    threshold = Number(before.status.threshold),
    overall = Number(before.materiality.overall);
  const amount = (measure <= threshold ? threshold - measure + 10000 : overall - measure + 10000).toFixed(2);
  await expect(summary.status()).toHaveAttribute("data-level", before.status.level);
  await summary.addMisstatement({
    kind: "Judgemental — a difference in an estimate",
    account: "Inventory obsolescence provision",
    assertion: "Valuation",
    description: "Slow-moving tents and stoves: our estimate of the provision exceeds management's.",
    amount,
    incomeEffect: amount,
    balanceEffect: amount,
  });
  await expect(summary.status()).not.toHaveAttribute("data-level", before.status.level);
  await expect(summary.status()).toHaveAttribute(
    "data-level",
    measure <= threshold ? "approaching" : "exceeds-overall",
  );
  await expect(
    page.getByText(measure <= threshold ? "What the standards expect now" : "Exceeds overall materiality").first(),
  ).toBeVisible();
  await shot(page, "2-summary-after");

  // The workbook: the same figures, text guarded against formulas.
  const [xlsx] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "Export workbook (.xlsx)" }).click(),
  ]);
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(fs.readFileSync(await xlsx.path()) as unknown as ArrayBuffer);
  const rows = wb.getWorksheet("Rows")!;
  const texts: string[] = [];
  rows.eachRow((r) =>
    r.eachCell((c) => {
      if (typeof c.value === "string") texts.push(c.value);
    }),
  );
  expect(texts).toContain("Inventory obsolescence provision");
  const statusCell = wb
    .getWorksheet("Summary")!
    .getColumn(1)
    .values.find((v) => typeof v === "string" && /^(Approaching|Exceeds)/.test(v));
  expect(statusCell).toBeTruthy();

  // The draft workpaper: saved, its pages rendered to PNG for a person to look at.
  const [pdf] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "Draft workpaper (PDF)" }).click(),
  ]);
  const pdfPath = test.info().outputPath("summary.pdf");
  await pdf.saveAs(pdfPath);
  expect(fs.readFileSync(pdfPath).subarray(0, 5).toString()).toBe("%PDF-");
  const text = execFileSync("pdftotext", [pdfPath, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
  expect(text).toContain(Number(amount).toLocaleString("en-US", { minimumFractionDigits: 2 })); // the entry, as printed in the schedule
  expect(text).toMatch(/do not add linearly/);
  execFileSync("pdftoppm", ["-png", "-r", "60", pdfPath, test.info().outputPath("summary-page")]);

  // Leave the demo engagement's summary as it was: remove the entry (kept in the audit trail).
  const added = (
    await (await page.request.get(`/api/engagements/${engagementId}/misstatements`)).json()
  ).summary.entries.at(-1);
  page.once("dialog", (d) => void d.accept());
  await page.getByRole("button", { name: `Remove ${added.reference}` }).click();
  await expect(summary.status()).toHaveAttribute("data-level", before.status.level);
});
