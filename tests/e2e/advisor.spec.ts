import fs from "node:fs";
import { execFileSync } from "node:child_process";
import { expect, test, type Page } from "@playwright/test";
import { SignInPage } from "./pages/sign-in-page";
import { AdvisorPanel } from "./pages/advisor-panel";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

const shot = (page: Page, name: string) => page.screenshot({ path: test.info().outputPath(name), fullPage: true });

test("a senior runs the estimator advisor on the demo ledger, reads the recommendation, keeps it, and the workpaper prints it", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAndWait("senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  // The demo ledger (db/seeds/demo-fieldwork.ts loads the same 2,400 generated lines on `npm start`).
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("demo-ledger.csv"),
    rows: 2400,
    seed: 20260930,
    name: "Demo ledger for the advisor (e2e)",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables valuation — advisor e2e",
      objective: "Estimate the audited value of trade receivables.",
      assertion: "Valuation",
      direction: "overstatement",
      params: {
        method: "random",
        estimator: "difference",
        confidence: 0.95,
        tolerableMisstatement: (Number(population.positiveTotal) * 0.05).toFixed(2),
        sampleSize: 80,
        sizeReason: "advisor e2e",
      },
    },
  });
  expect(planned.status(), await planned.text()).toBe(201);
  const { sample } = await planned.json();
  await page.goto(`/engagements/${engagementId}/samples/${sample.id}`);

  const advisor = new AdvisorPanel(page);
  await expect(advisor.field("Sample sizes")).toHaveValue("40, 80, 160");
  await advisor.field("Items misstated (%)").fill("8");
  await advisor.field("Size of each misstatement").selectOption("mostly-small");
  await advisor.field("Trials per size").fill("20000");
  await advisor.field("Simulation seed (optional)").fill("2026");
  await advisor.run();
  await expect(advisor.progress()).toBeVisible();
  await expect(advisor.recommendation()).toBeVisible({ timeout: 90_000 });
  await expect(advisor.recommendation()).toContainText(
    /Recommended: (Mean-per-unit|Difference|Ratio|Regression)|No estimator meets the confidence/,
  );
  await expect(advisor.recommendation()).toContainText("Mean-per-unit:");
  // The demo ledger holds credit notes: ratio and regression are still simulated (defined whenever the sample's book total is not zero),
  // with the bias-corrected ratio forms beside them as comparison rows.
  for (const e of [
    "Mean-per-unit",
    "Difference",
    "Ratio",
    "Regression",
    "Jackknife ratio \\(Quenouille\\)",
    "Beale ratio",
    "Tin ratio",
  ])
    await expect(advisor.histogram(e)).toBeVisible();
  await expect(advisor.recommendation()).toContainText("(for comparison)");
  // The zoom shows one estimator on its own scale with the true total and its mean marked.
  await advisor.root.getByRole("radio", { name: "Ratio", exact: true }).check();
  await expect(
    advisor.root
      .getByTestId("estimate-zoom")
      .getByRole("img", { name: /^Zoomed, own scale: Ratio: histogram .*; mean estimate / }),
  ).toBeVisible();
  await expect(advisor.root.getByTestId("estimate-zoom").getByText(/^mean /)).toBeVisible();
  await expect(advisor.root.getByRole("img", { name: /^RMSE against sample size/ })).toBeVisible();
  await expect(advisor.root.getByRole("img", { name: /^Coverage against sample size/ })).toBeVisible();
  await expect(
    advisor.root.getByText(/support, and do not replace, the auditor's professional judgement/),
  ).toBeVisible();
  await shot(page, "advisor-results.png");
  await advisor.root.screenshot({ path: test.info().outputPath("advisor-panel.png") });

  // The plan's estimator (difference) may not be the one recommended: keeping the run then needs a written reason.
  await advisor.keepAsRationale(
    "Difference kept: misstatements are expected to be small and not proportional to book value.",
  );
  await expect(advisor.root.getByText("Rationale kept: run")).toBeVisible();

  // Drawn, the plan is final: the kept run stays on the page, read-only, and goes into the workpaper.
  const drawn = await page.request.post(`/api/engagements/${engagementId}/samples/${sample.id}/draw`, {
    data: { seed: 77 },
  });
  expect(drawn.status(), await drawn.text()).toBe(201);
  // Two results, the fewest the classical evaluation (and so the draft workpaper) needs.
  const itemsRes = await page.request.get(`/api/engagements/${engagementId}/samples/${sample.id}/items?pageSize=10`);
  const { items } = (await itemsRes.json()) as { items: { id: number; version: number; bookValue: string }[] };
  for (const item of items.slice(0, 2)) {
    const saved = await page.request.patch(`/api/engagements/${engagementId}/samples/${sample.id}/items/${item.id}`, {
      data: { version: item.version, status: "done", auditedValue: item.bookValue },
    });
    expect(saved.status(), await saved.text()).toBe(200);
  }
  await page.reload();
  await expect(advisor.root.getByText("Rationale kept: run")).toBeVisible();
  await expect(advisor.root.getByRole("button", { name: "Run the advisor" })).toHaveCount(0);
  await expect(advisor.recommendation()).toBeVisible();

  const pdf = await page.request.get(`/api/engagements/${engagementId}/samples/${sample.id}/workpaper`);
  expect(pdf.status(), pdf.status() === 200 ? "" : await pdf.text()).toBe(200);
  const pdfPath = test.info().outputPath("workpaper-with-rationale.pdf");
  fs.writeFileSync(pdfPath, await pdf.body());
  const text = execFileSync("pdftotext", ["-layout", pdfPath, "-"]).toString();
  expect(text).toContain("Rationale for the method: estimator advisor");
  expect(text).toContain("seed 2026 (entered)");
  expect(text).toMatch(/8\.0% of items misstated/);
  expect(text.replace(/\s+/g, " ")).toMatch(
    /Kept as the rationale with this reason: Difference kept: misstatements are expected to be small/,
  );
});

test("a run asked for last stays on show when a run clicked before answers late", async ({ page }) => {
  test.setTimeout(120_000);
  await new SignInPage(page).signInAndWait("senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 300,
    seed: 515,
    name: "Receivables for the late answer (e2e)",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables valuation — late answer e2e",
      objective: "Estimate the audited value of trade receivables.",
      assertion: "Valuation",
      direction: "overstatement",
      params: {
        method: "random",
        estimator: "difference",
        confidence: 0.95,
        tolerableMisstatement: (Number(population.positiveTotal) * 0.05).toFixed(2),
        sampleSize: 30,
        sizeReason: "late answer e2e",
      },
    },
  });
  expect(planned.status(), await planned.text()).toBe(201);
  const { sample } = await planned.json();
  const base = `/api/engagements/${engagementId}/samples/${sample.id}/advisor`;
  // Two small finished runs, streamed to the end (the last line is the result).
  const runIds: number[] = [];
  for (const seed of [11, 12]) {
    const streamed = await page.request.post(base, {
      data: {
        scenario: { kind: "pattern", misstatedPercent: 5, tainting: "mostly-small", overstatementPercent: 90 },
        sampleSizes: [20],
        trials: 200,
        seed,
      },
    });
    expect(streamed.status(), await streamed.text()).toBe(200);
    const events = (await streamed.text())
      .trim()
      .split("\n")
      .map((line) => JSON.parse(line) as { type: string; runId?: number });
    expect(events.at(-1)?.type).toBe("result");
    runIds.push(events.find((e) => e.type === "started")!.runId!);
  }
  const [first, second] = runIds;

  // The first run's answer is held back until the second one is on show.
  let release!: () => void;
  const held = new Promise<void>((resolve) => {
    release = resolve;
  });
  await page.route(`**${base}/${first}`, async (route) => {
    await held;
    await route.continue();
  });
  await page.goto(`/engagements/${engagementId}/samples/${sample.id}`);
  const advisor = new AdvisorPanel(page);
  await advisor.root.getByText(/^Earlier runs/).click();
  const show = (runId: number) =>
    advisor.root
      .getByRole("listitem")
      .filter({ hasText: `#${runId}` })
      .getByRole("button", { name: "Show" });
  await show(first).click();
  await show(second).click();
  await expect(advisor.root.getByRole("heading", { name: new RegExp(`^Run ${second} · `) })).toBeVisible();
  const late = page.waitForResponse((res) => res.url().endsWith(`${base}/${first}`));
  release();
  expect((await late).status()).toBe(200);
  // The late answer came (and was kept in the cache), but the run on show is still the one asked for last.
  await expect(advisor.root.getByRole("heading", { name: new RegExp(`^Run ${second} · `) })).toBeVisible();
  await expect(advisor.root.getByRole("heading", { name: new RegExp(`^Run ${first} · `) })).toHaveCount(0);
});
