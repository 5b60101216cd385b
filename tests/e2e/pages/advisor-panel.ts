import { expect, type Locator, type Page } from "@playwright/test";

/** The estimator advisor card on a planned sample's page. */
export class AdvisorPanel {
  readonly root: Locator;
  constructor(private readonly page: Page) {
    this.root = page
      .getByRole("region", { name: "Estimator advisor" })
      .or(page.locator("section").filter({ has: page.getByRole("heading", { name: "Estimator advisor" }) }))
      .first();
  }

  field(label: string | RegExp) {
    return this.root.getByRole("form", { name: "Advisor inputs" }).getByLabel(label);
  }

  async run() {
    await this.root.getByRole("button", { name: "Run the advisor" }).click();
  }

  progress() {
    return this.root.getByRole("progressbar", { name: "Advisor progress" });
  }

  recommendation() {
    return this.root.getByRole("region", { name: "Recommendation" });
  }

  histogram(estimator: string) {
    return this.root.getByRole("img", { name: new RegExp(`^${estimator}: histogram of estimated audited totals`) });
  }

  async keepAsRationale(reason?: string) {
    if (reason) await this.root.getByLabel(/^Reason for keeping this run/).fill(reason);
    await this.root.getByRole("button", { name: "Keep as the rationale for the method" }).click();
    await expect(this.root.getByText("Kept with the plan as the rationale for the method")).toBeVisible();
  }
}
