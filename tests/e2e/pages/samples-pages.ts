import { expect, type Locator, type Page } from "@playwright/test";

/** "Plan a sample": the form on the left, the server's live size on the right. */
export class PlanSamplePage {
  constructor(private readonly page: Page) {}

  async openFromEngagement() {
    await this.page.getByRole("link", { name: "Plan a sample" }).click();
    await expect(this.page.getByRole("heading", { name: "Plan a sample" })).toBeVisible();
  }

  async describe(d: { populationId: number; name: string; objective: string; assertion: string; direction?: string }) {
    await this.page.getByLabel("Population", { exact: true }).selectOption(String(d.populationId));
    await this.page.getByLabel("Sample name").fill(d.name);
    await this.page.getByLabel("Objective of the test").fill(d.objective);
    await this.page.getByLabel("Assertion", { exact: true }).fill(d.assertion);
    if (d.direction) await this.page.getByLabel("Misstatement tested for").selectOption(d.direction);
  }

  method(label: string) {
    return this.page.getByLabel("Sampling method").selectOption({ label });
  }

  field(label: string | RegExp) {
    return this.page.getByLabel(label);
  }

  sizePanel() {
    return this.page.getByTestId("size-panel");
  }

  chosenSize() {
    return this.page.getByTestId("chosen-size");
  }

  async save() {
    await this.page.getByRole("button", { name: "Save the plan" }).click();
  }
}

/** A sample's page: Plan, Draw, and Results and evaluation tabs. */
export class SamplePage {
  constructor(readonly page: Page) {}

  tab(name: "Plan" | "Draw" | "Results and evaluation") {
    return this.page.getByRole("tab", { name: new RegExp(`^${name}`) });
  }

  async open(name: "Plan" | "Draw" | "Results and evaluation") {
    await this.tab(name).click();
    await expect(this.tab(name)).toHaveAttribute("aria-selected", "true");
  }

  async draw(seed?: string) {
    if (seed !== undefined) await this.page.getByLabel("Seed (optional)", { exact: true }).fill(seed);
    await this.page.getByRole("button", { name: "Draw the sample" }).click();
  }

  async reperform() {
    await this.page.getByRole("button", { name: "Re-perform the selection" }).click();
    return this.page.getByTestId("reperform-result");
  }

  grid() {
    return this.page.getByRole("table", { name: "Sample items" });
  }

  row(itemRef: string): Locator {
    return this.page.getByTestId(`item-row-${itemRef}`);
  }

  /** Keys in one item's result and saves it, waiting until the row shows who saved it. */
  async record(
    itemRef: string,
    r: { audited?: string; status?: string; cause?: string; causeNote?: string; comment?: string },
    savedBy?: string,
  ) {
    const row = this.row(itemRef);
    if (r.status) await row.getByLabel(`Status of ${itemRef}`).selectOption({ label: r.status });
    if (r.audited !== undefined) await row.getByLabel(`Audited value of ${itemRef}`).fill(r.audited);
    if (r.cause) await row.getByLabel(`Cause of misstatement in ${itemRef}`).selectOption({ label: r.cause });
    if (r.causeNote) await row.getByLabel(`Cause details for ${itemRef}`).fill(r.causeNote);
    if (r.comment) await row.getByLabel(`Comment on ${itemRef}`).fill(r.comment);
    await row.getByRole("button", { name: `Save ${itemRef}` }).click();
    if (savedBy) await expect(row.getByText(`saved by ${savedBy}`)).toBeVisible();
  }

  progress(id: "done" | "not-auditable" | "misstatements" | "misstatement-total") {
    return this.page.getByTestId(`progress-${id}`);
  }

  evaluation() {
    return this.page.getByTestId("evaluation-panel");
  }

  conflict() {
    return this.page.getByTestId("row-conflict");
  }
}
