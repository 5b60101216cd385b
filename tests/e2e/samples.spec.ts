import { expect, test, type Locator, type Page } from "@playwright/test";
import { DEMO, SignInPage } from "./pages/sign-in-page";
import { PlanSamplePage, SamplePage } from "./pages/samples-pages";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

const TESSALY = "Tessaly Outdoor Supply Inc.";
const SAMPLE_NAME = "Receivables existence — e2e PPS";

const shot = (page: Page, name: string) => page.screenshot({ path: test.info().outputPath(name), fullPage: true });
const shotOf = (locator: Locator, name: string) => locator.screenshot({ path: test.info().outputPath(name) });

/** 1234.5 → "1,234.50", as <Amount> shows it. */
const shown = (n: number | string) => {
  const [whole, frac] = (typeof n === "number" ? n.toFixed(2) : n).replace("-", "").split(".");
  return `${String(n).startsWith("-") ? "−" : ""}${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",")}.${frac}`;
};

interface ApiItem {
  id: number;
  itemRef: string;
  bookValue: string;
  topStratum: boolean;
  version: number;
}

test("a senior plans and draws a PPS sample; staff record results and the Stringer bound updates; a stale save is refused", async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);
  const sample = new SamplePage(page);
  let engagementId = 0;
  let sampleUrl = "";
  let tolerable = "";

  await test.step("the senior loads and reconciles a ledger through the API", async () => {
    await new SignInPage(page).signInAndWait("senior");
    engagementId = await engagementIdByClient(page.request, TESSALY);
    const population = await loadReconciledLedger(page.request, {
      engagementId,
      path: test.info().outputPath("receivables.csv"),
      rows: 600,
      seed: 20260930,
      name: "Receivables at 30 Sep 2026 (e2e)",
    });
    // About 75 items: n = ⌈BV × 3.0 / TM⌉ with TM at 4% of the book value.
    tolerable = Math.round(Number(population.positiveTotal) * 0.04).toFixed(2);
    await page.goto(`/engagements/${engagementId}`);
    await expect(
      page.getByRole("table", { name: "Populations" }).getByText("Receivables at 30 Sep 2026 (e2e)"),
    ).toBeVisible();
    await shot(page, "01-overview-before-sample.png");

    const plan = new PlanSamplePage(page);
    await plan.openFromEngagement();
    await plan.describe({
      populationId: population.id,
      name: SAMPLE_NAME,
      objective: "Confirm that recorded trade receivables exist at the period end.",
      assertion: "Existence",
      direction: "overstatement",
    });
    await expect(plan.field(/Tolerable misstatement/)).toHaveValue("900000.00"); // the engagement's performance materiality
    // A typed confidence is an override of the risk assessment, with its reason (issue 15).
    await plan.field("Confidence from").selectOption({ label: "A typed confidence (override, with a reason)" });
    await plan.field("Reason for typing the confidence").fill("Group instructions fix 95 % for this component");
    await expect(page.getByLabel("Confidence", { exact: true })).toHaveValue("95");
    await plan.field(/Tolerable misstatement/).fill(tolerable);
    // The firm's default methodology: confidence factors (AICPA Guide, 2008 and later), n = ⌈R × BV / TM⌉.
    await expect(plan.sizePanel().getByText("n = ⌈R × BV / TM⌉", { exact: false })).toBeVisible();
    await expect(page.getByTestId("mus-methodology")).toContainText("Sized with confidence factors (current Guide)");
    await expect(
      plan.sizePanel().getByRole("table", { name: "Inputs to the size" }).getByText(shown(tolerable)),
    ).toBeVisible();
    const computed = Number(await plan.chosenSize().textContent());
    expect(computed).toBeGreaterThan(40);
    await shot(page, "02-plan-live-size.png");

    // A smaller sample needs a reason: the server says so, naming the computed size.
    await plan.field("Items to select").fill(String(computed - 10));
    await expect(plan.sizePanel().getByText(`below the computed size ${computed}`)).toBeVisible();
    await expect(plan.field("Reason for a size below the computed one")).toBeVisible();
    await shot(page, "03-plan-size-below-needs-reason.png");
    await plan.field("Items to select").fill("");
    await expect(plan.chosenSize()).toHaveText(String(computed));
    await plan.save();
    await expect(page.getByRole("heading", { name: SAMPLE_NAME })).toBeVisible();
    sampleUrl = page.url();
  });

  await test.step("the senior draws the sample and re-performs it", async () => {
    await expect(sample.tab("Draw")).toHaveAttribute("aria-selected", "true");
    await shot(page, "04-sample-not-drawn.png");
    await sample.draw();
    await expect(sample.tab("Results and evaluation")).toHaveAttribute("aria-selected", "true");
    await expect(sample.grid()).toBeVisible();
    await sample.open("Draw");
    await expect(page.getByTestId("draw-seed")).toHaveText(/^\d+$/);
    await expect(page.getByTestId("population-sha")).toHaveText(/^[0-9a-f]{64}$/);
    const result = await sample.reperform();
    await expect(result).toContainText("matches the stored one, item by item");
    await expect(page.getByRole("table", { name: "Draw history" })).toContainText("current");
    await shot(page, "05-draw-and-reperform.png");
    await new SignInPage(page).signOut();
  });

  const apiBase = () => `${new URL(sampleUrl).pathname.replace(/^\/engagements/, "/api/engagements")}`;
  let items: ApiItem[] = [];

  await test.step("staff key in results: a clean item, a misstatement, an item that could not be audited", async () => {
    await new SignInPage(page).signInAndWait("staff");
    await page.goto(sampleUrl);
    await expect(sample.tab("Results and evaluation")).toHaveAttribute("aria-selected", "true");
    items = (await (await page.request.get(`${apiBase()}/items?pageSize=25`)).json()).items;
    const below = items.filter((it) => !it.topStratum);
    expect(below.length).toBeGreaterThan(5);
    const [clean, misstated, unauditable, clean2] = below;
    await sample.record(
      clean.itemRef,
      { audited: clean.bookValue, comment: "Agreed to the customer's confirmation" },
      DEMO.staff.name,
    );
    const half = (Number(misstated.bookValue) / 2).toFixed(2);
    const row = sample.row(misstated.itemRef);
    await row.getByLabel(`Audited value of ${misstated.itemRef}`).fill(half);
    // The misstatement is shown as typed, before saving.
    await expect(row.getByTestId("row-misstatement")).toHaveText(
      shown((Number(misstated.bookValue) - Number(half)).toFixed(2)),
    );
    await sample.record(
      misstated.itemRef,
      { cause: "Pricing or rate", causeNote: "Invoiced at the list price, not the contract price" },
      DEMO.staff.name,
    );
    // Choosing the status says on the row, before any save, how the evaluation counts the item (an overstatement test: audited 0).
    const unauditableRow = sample.row(unauditable.itemRef);
    await expect(unauditableRow.getByTestId("row-unauditable-treatment")).toHaveCount(0);
    await unauditableRow.getByLabel(`Status of ${unauditable.itemRef}`).selectOption({ label: "Could not be audited" });
    await expect(unauditableRow.getByTestId("row-unauditable-treatment")).toHaveText(
      "Evaluated as audited 0: misstated by its whole book value (100% overstatement).",
    );
    await expect(unauditableRow.getByLabel(`Status of ${unauditable.itemRef}`)).toHaveAccessibleDescription(
      /Evaluated as audited 0/,
    );
    await sample.record(
      unauditable.itemRef,
      { status: "Could not be audited", comment: "No confirmation reply and no subsequent receipt" },
      DEMO.staff.name,
    );
    await expect(unauditableRow.getByTestId("row-unauditable-treatment")).toBeVisible();
    await sample.record(clean2.itemRef, { audited: clean2.bookValue }, DEMO.staff.name);
    await expect(sample.progress("done")).toHaveText(
      "4 of " + (await (await page.request.get(`${apiBase()}/evaluation`)).json()).evaluation.progress.total,
    );
    await expect(sample.progress("not-auditable")).toHaveText("1");
    await expect(sample.progress("misstatements")).toHaveText("2");
    await shot(page, "06-results-keyed-in.png");
  });

  await test.step("the evaluation panel shows the Stringer bound the API computes", async () => {
    const { evaluation } = await (await page.request.get(`${apiBase()}/evaluation`)).json();
    const over = evaluation.block.overstatement;
    const J = Number(evaluation.block.interval);
    const panel = sample.evaluation();
    await expect(panel.getByTestId("upper-limit-overstatement")).toHaveText(shown(over.upperLimit));
    await expect(panel.getByTestId("projected-overstatement")).toHaveText(shown(over.projected));
    await expect(panel.getByTestId("basic-precision-overstatement")).toHaveText(shown(over.basicPrecision));
    // Zero-event Poisson upper limit at 95%: −ln(0.05) = 2.995732 (printed tables round it up to 3.00).
    expect(Number(over.basicPrecision)).toBeCloseTo(2.995732 * J, 0);
    // Two overstatements: the half-misstated item (tainting 0.5) and the unaudited one (tainting 1).
    expect(over.rows).toHaveLength(2);
    expect(over.rows[0].tainting).toBe(1);
    expect(over.rows[1].tainting).toBeCloseTo(0.5, 3);
    await expect(
      panel.getByRole("table", { name: "Stringer bound — overstatement" }).getByRole("row", { name: /Rank 2/ }),
    ).toContainText(`${(over.rows[1].tainting * 100).toFixed(2)}%`);
    await expect(panel.getByTestId("conclusion")).toContainText("Provisional");
    await expect(panel.getByTestId("judgement-caution")).toContainText("AU-C 530, ISA 530, AS 2315");
    await shotOf(panel, "07-evaluation-panel.png");
  });

  await test.step("a save made on a stale copy is refused with who changed the item", async () => {
    const target = items.filter((it) => !it.topStratum)[5];
    // Staff's page was loaded before the senior's change below, so its row holds the old version.
    await page.reload();
    await expect(sample.row(target.itemRef)).toBeVisible();
    const other = await browser.newContext();
    const seniorPage = await other.newPage();
    await new SignInPage(seniorPage).signInAndWait("senior");
    await seniorPage.goto(sampleUrl);
    const seniorSample = new SamplePage(seniorPage);
    await seniorSample.record(
      target.itemRef,
      { audited: target.bookValue, comment: "Agreed to cash received after the period end" },
      DEMO.senior.name,
    );
    await shot(seniorPage, "08-second-user-saved.png");

    await sample.record(target.itemRef, { audited: (Number(target.bookValue) - 1).toFixed(2) });
    await expect(sample.conflict()).toContainText(`${DEMO.senior.name} changed this item`);
    await expect(sample.conflict()).toContainText("yours was not saved");
    await shot(page, "09-stale-save-refused.png");
    await sample.conflict().getByRole("button", { name: "Reload the item" }).click();
    await expect(sample.row(target.itemRef).getByText(`saved by ${DEMO.senior.name}`)).toBeVisible();
    await expect(sample.row(target.itemRef).getByLabel(`Audited value of ${target.itemRef}`)).toHaveValue(
      target.bookValue,
    );
    await shot(page, "10-after-reload.png");
    await other.close();
  });

  await test.step("the overview lists the sample", async () => {
    await page.goto(`/engagements/${engagementId}`);
    const list = page.getByRole("table", { name: "Samples" });
    await expect(list.getByRole("link", { name: SAMPLE_NAME })).toBeVisible();
    await expect(list).toContainText("Monetary-unit (PPS)");
    await expect(page.getByRole("link", { name: "Plan a sample" })).toHaveCount(0); // staff do not plan
    await shot(page, "11-overview-with-sample.png");
  });
});

test("a senior sees the Neyman allocation while editing strata, and an attribute sample evaluates deviations", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAndWait("senior");
  const engagementId = await engagementIdByClient(page.request, TESSALY);
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 400,
    seed: 7,
    name: "Sales invoices Q3 (e2e)",
  });
  await page.goto(`/engagements/${engagementId}/samples/new`);
  const plan = new PlanSamplePage(page);
  await plan.describe({
    populationId: population.id,
    name: "Receivables valuation — stratified",
    objective: "Estimate the audited value of receivables by book-value band.",
    assertion: "Valuation and allocation",
  });
  await plan.method("Stratified random, classical variables");
  // Sized from the risk assessment (issue 15): the firm's table maps the two risks to the confidence.
  await plan.field("Assessed risk of material misstatement").selectOption({ label: "Maximum" });
  await plan.field("Risk other substantive procedures fail to detect").selectOption({ label: "Maximum" });
  await plan.field(/Tolerable misstatement/).fill("30000");
  await plan.field("Estimator").selectOption({ label: "Combined ratio" });
  const allocation = page.getByRole("table", { name: "Allocation by stratum" });
  await expect(allocation).toBeVisible();
  await expect(plan.sizePanel().getByRole("table", { name: "Inputs to the size" })).toContainText("30,000.00");
  await expect(plan.sizePanel()).toHaveAttribute("aria-busy", "false");
  await expect(allocation.getByRole("row")).toHaveCount(1 + 3 + 1); // header, three bands, total
  // Cochran, Sampling Techniques (1977), eq. 5.26 (Neyman allocation): n_h = n · N_h S_h / Σ N_h S_h, to within
  // rounding; a stratum whose share would exceed N_h is taken in full and the rest shared out again (Cochran §5.8).
  const cells = await allocation
    .locator("tbody tr")
    .evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td")).map((td) => td.textContent ?? "")));
  const figures = (t: string) => Number(t.replace(/[,\s]/g, ""));
  const bands = cells.slice(0, -1).map((c) => ({ N: figures(c[1]), S: figures(c[3]), n: figures(c[4]) }));
  const shared = bands.filter((b) => b.n < b.N);
  const n = shared.reduce((a, b) => a + b.n, 0);
  const weight = shared.reduce((a, b) => a + b.N * b.S, 0);
  expect(shared.length).toBeGreaterThan(0);
  for (const b of shared) expect(Math.abs(b.n - (n * b.N * b.S) / weight)).toBeLessThanOrEqual(1);
  for (const b of bands.filter((x) => x.n >= x.N)) expect((b.N * b.S) / weight).toBeGreaterThanOrEqual(b.N / n - 1e-9); // census only where the Neyman share reaches N_h
  await page.getByRole("button", { name: "Remove boundary 2" }).click();
  await expect(allocation.getByRole("row")).toHaveCount(1 + 2 + 1);
  await expect(allocation).toContainText("above");
  await shot(page, "s1-stratified-plan.png");

  // A difference plan without a planning spread is warned that its size is the mean-per-unit one; an entered figure needs a reason.
  await plan.method("Simple random, classical variables");
  await plan.field("Estimator").selectOption({ label: "Difference" });
  await expect(plan.sizePanel().getByText(/the size is the mean-per-unit size/)).toBeVisible();
  await plan.field("Expected standard deviation from").selectOption({ label: "A figure I enter, with its reason" });
  await plan.field(/Expected standard deviation \(/).fill("40");
  await plan.field("Where the figure comes from").fill("Prior-year differences on this account");
  await expect(plan.sizePanel().getByText(/S = 40\.00, entered by the planner: Prior-year differences/)).toBeVisible();
  await expect(plan.sizePanel().getByText(/the size is the mean-per-unit size/)).toHaveCount(0);
  await shot(page, "s1b-difference-plan-spread.png");

  await plan.method("Attribute sampling (test of controls)");
  await plan.field("Confidence from").selectOption({ label: "A typed confidence (override, with a reason)" });
  await plan.field("Reason for typing the confidence").fill("Control tests use the firm's 95 % reliance level");
  await page.getByLabel("Confidence", { exact: true }).fill("95");
  await plan.field("Tolerable deviation rate").fill("5");
  await plan.field("Expected deviation rate").fill("0");
  // 400 items is under the firm's 5,000: hypergeometric, M = ⌈5% × 400⌉ = 20; scipy 1.17.1 hypergeom.cdf(0, 400, 20, 55) = 0.04798 ≤ 0.05
  // (the binomial Table A-1 size for a large population would be 59).
  await expect(plan.chosenSize()).toHaveText("55");
  await expect(plan.sizePanel().getByTestId("plan-notes")).toContainText("under the firm's threshold of 5,000");
  await shot(page, "s2-attribute-plan.png");
  // A manual control sized from the firm's frequency table prints the row used.
  await plan.field("Size set by").selectOption({ label: "Control frequency (manual control)" });
  await plan.field("How often the control operates").selectOption({ label: "Weekly" });
  await expect(plan.chosenSize()).toHaveText("5");
  await expect(plan.sizePanel().getByTestId("plan-notes")).toContainText("Row used: Weekly → 5 items");
  await shot(page, "s2b-control-frequency-plan.png");
  await plan.field("Size set by").selectOption({ label: "Statistical attribute plan" });
  await expect(plan.chosenSize()).toHaveText("55");
  await plan.field("Sample name").fill("Credit approval on sales invoices");
  await plan
    .field("Objective of the test")
    .fill("Test that each invoice above the credit limit was approved before dispatch.");
  await page.getByLabel("Assertion", { exact: true }).fill("Occurrence");
  await plan.save();
  await expect(page.getByRole("heading", { name: "Credit approval on sales invoices" })).toBeVisible();
  const sample = new SamplePage(page);
  await sample.draw("20260930");
  await expect(sample.grid()).toBeVisible();
  const items: ApiItem[] = (
    await (
      await page.request.get(
        `${new URL(page.url()).pathname.replace(/^\/engagements/, "/api/engagements")}/items?pageSize=10`,
      )
    ).json()
  ).items;
  const [first, second] = items;
  const row = sample.row(first.itemRef);
  await row.getByLabel(`Deviation found in ${first.itemRef}`).selectOption({ label: "Deviation" });
  await row.getByLabel(`Nature of the deviation in ${first.itemRef}`).fill("Dispatched before approval");
  await row.getByRole("button", { name: `Save ${first.itemRef}` }).click();
  await expect(row.getByText(`saved by ${DEMO.senior.name}`)).toBeVisible();
  await sample
    .row(second.itemRef)
    .getByLabel(`Deviation found in ${second.itemRef}`)
    .selectOption({ label: "No deviation" });
  await sample
    .row(second.itemRef)
    .getByRole("button", { name: `Save ${second.itemRef}` })
    .click();
  await expect(sample.row(second.itemRef).getByText(`saved by ${DEMO.senior.name}`)).toBeVisible();
  const panel = sample.evaluation();
  await expect(panel.getByTestId("deviations")).toHaveText("1");
  await expect(panel.getByTestId("sample-rate")).toHaveText("50.00%");
  // Hypergeometric upper limit, 1 deviation in 2 of N = 400 at 95%: P(X ≤ 1) = 1 − M(M − 1)/(400·399) > 0.05 holds up to M = 389
  // (scipy hypergeom.cdf(1, 400, 389, 2) = 0.0543, (…, 390, …) = 0.0495) → 389/400 = 97.25%.
  await expect(panel.getByTestId("upper-deviation-limit")).toHaveText("97.25%");
  await shot(page, "s3-attribute-results.png");
  // Monetary-unit and systematic samples are never replaced item by item; attribute items can be.
  await expect(sample.row(items[2].itemRef).getByRole("button", { name: "Replace…" })).toBeVisible();
});
