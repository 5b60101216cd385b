import { expect, type Page } from "@playwright/test";

/** The engagement's summary of misstatements, as a person uses it. */
export class MisstatementsPage {
  constructor(private readonly page: Page) {}

  async openFromEngagement(engagementId: number) {
    await this.page.goto(`/engagements/${engagementId}`);
    await this.page
      .getByRole("navigation", { name: "Engagement" })
      .getByRole("link", { name: "Summary of misstatements" })
      .click();
    await expect(this.page.getByRole("heading", { level: 1, name: "Summary of misstatements" })).toBeVisible();
  }

  status() {
    return this.page.getByTestId("summary-status");
  }

  async addMisstatement(v: {
    kind: string;
    account: string;
    assertion: string;
    description: string;
    amount: string;
    incomeEffect: string;
    balanceEffect: string;
  }) {
    const form = this.page.getByRole("form", { name: "Add a misstatement" });
    await form.getByLabel("Kind").selectOption({ label: v.kind });
    await form.getByLabel("Account").fill(v.account);
    await form.getByLabel("Assertion").fill(v.assertion);
    await form.getByLabel("Description").fill(v.description);
    await form.getByLabel("Amount").fill(v.amount);
    await form.getByLabel("Income-statement effect").fill(v.incomeEffect);
    await form.getByLabel("Balance-sheet effect").fill(v.balanceEffect);
    await form.getByRole("button", { name: "Add misstatement" }).click();
    await expect(form.getByRole("status")).toHaveText("Misstatement added to the summary.");
  }
}
