import { expect, test, type Page } from "@playwright/test";
import { SignInPage } from "./pages/sign-in-page";
import { SamplePage } from "./pages/samples-pages";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

const shot = (page: Page, name: string) => page.screenshot({ path: test.info().outputPath(name), fullPage: true });

test("a senior edits a plan before the draw, then extends the drawn sample and replaces a void item", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAndWait("senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 500,
    seed: 424242,
    name: "Ledger for plan changes (e2e)",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Valuation — first plan",
      objective: "Estimate the audited value of receivables.",
      assertion: "Valuation",
      direction: "both",
      params: {
        method: "random",
        estimator: "mean-per-unit",
        confidence: 0.9,
        tolerableMisstatement: (Number(population.positiveTotal) * 0.1).toFixed(2),
        sampleSize: 30,
        sizeReason: "first pass",
      },
    },
  });
  expect(planned.status(), await planned.text()).toBe(201);
  const { sample } = await planned.json();
  const base = `/api/engagements/${engagementId}/samples/${sample.id}`;

  await test.step("the plan is edited before the draw", async () => {
    await page.goto(`/engagements/${engagementId}/samples/${sample.id}/edit`);
    // By role, not by label: Next can keep a hidden copy of the form in the DOM while it hydrates.
    const field = (name: string) => page.getByRole("textbox", { name, exact: true });
    await field("Sample name").fill("Valuation — revised plan");
    await field("Items to select").fill("25");
    const reason = field("Reason for a size below the computed one");
    if (await reason.isVisible()) await reason.fill("Revised after discussing the expected spread with the manager");
    await shot(page, "01-plan-edit.png");
    await page.getByRole("button", { name: "Save the changed plan" }).click();
    await expect(page.getByRole("heading", { name: "Valuation — revised plan" })).toBeVisible();
    const view = await (await page.request.get(base)).json();
    expect(view.sample.chosenSize).toBe(25);
    expect(view.sample.planVersion).toBe(2);
  });

  const s = new SamplePage(page);
  await test.step("drawn, then extended by five items down the same random ranking", async () => {
    await s.open("Draw");
    await s.draw("123");
    await expect(s.tab("Results and evaluation")).toHaveAttribute("aria-selected", "true");
    await s.open("Draw");
    await expect(page.getByRole("heading", { name: "Extend the sample" })).toBeVisible();
    await page.getByLabel("Items to add").fill("5");
    await page.getByLabel("Why the sample is extended").fill("Spread wider than planned");
    await page.getByRole("button", { name: "Extend the sample" }).click();
    await expect(page.getByText(/^5 items added, continuing the random numbers after rank 25\./)).toBeVisible();
    await shot(page, "02-extended.png");
    const { items } = (await (await page.request.get(`${base}/items?pageSize=100`)).json()) as {
      items: { origin: string }[];
    };
    expect(items).toHaveLength(30);
    expect(items.filter((i) => i.origin === "extension")).toHaveLength(5);
  });

  await test.step("an item that cannot be used is voided and replaced by the next in the ranking", async () => {
    await s.open("Results and evaluation");
    const first = s.grid().getByRole("row").nth(1);
    const ref = (await first.getByRole("cell").nth(1).textContent())?.trim() ?? ""; // after the row's tick box
    await first.getByRole("button", { name: "Replace…" }).click();
    const dialog = page.getByRole("dialog", { name: /^Replace / });
    await dialog.getByLabel("Why the item cannot be used").fill("Document voided before the period end");
    await shot(page, "03-replace-dialog.png");
    await dialog.getByRole("button", { name: "Void and replace" }).click();
    await expect(dialog).toBeHidden();
    const { items } = (await (await page.request.get(`${base}/items?pageSize=100&status=all`)).json()) as {
      items: { itemRef: string; origin: string; status: string; voidReason: string | null }[];
    };
    expect(items.filter((i) => i.status === "void")).toEqual([
      expect.objectContaining({ voidReason: "Document voided before the period end" }),
    ]);
    expect(items.filter((i) => i.origin === "replacement")).toHaveLength(1);
    expect(ref.length).toBeGreaterThan(0);
    await shot(page, "04-replaced.png");
  });
});
