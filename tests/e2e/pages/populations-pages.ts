import { expect, type Page } from "@playwright/test";

/** The "Load a ledger population" screen: file, mapping, load, outcome. */
export class LoadLedgerPage {
  constructor(private readonly page: Page) {}

  async openFromEngagement() {
    await this.page.getByRole("link", { name: "Load a ledger" }).click();
    await expect(this.page.getByRole("heading", { name: "Load a ledger population" })).toBeVisible();
  }

  async chooseFile(path: string) {
    await this.page.getByLabel("Ledger file").setInputFiles(path);
    await expect(this.page.getByRole("table", { name: "File preview" })).toBeVisible();
  }

  async mapColumns(m: {
    itemRef: string;
    bookValue: string;
    description?: string;
    date?: string;
    keep?: string[];
    name: string;
  }) {
    await this.page.getByLabel("Item reference").selectOption(m.itemRef);
    await this.page.getByLabel("Book value").selectOption(m.bookValue);
    await this.page.getByLabel("Description").selectOption(m.description ?? "");
    await this.page.getByLabel("Date", { exact: true }).selectOption(m.date ?? "");
    for (const column of m.keep ?? []) await this.page.getByRole("checkbox", { name: column }).check();
    await this.page.getByLabel("Population name").fill(m.name);
  }

  async load() {
    await this.page.getByRole("button", { name: "Check and load" }).click();
  }

  problems() {
    return this.page.getByRole("table", { name: "Problems found" });
  }
}

/** A population's profile: header, reconciliation, threshold tool, items grid. */
export class PopulationProfilePage {
  constructor(private readonly page: Page) {}

  status() {
    return this.page.getByRole("heading", { level: 1 });
  }

  async reconcile(controlTotal: string, controlCount: string, explanation?: string) {
    await this.page.getByLabel(/Control total/).fill(controlTotal);
    await this.page.getByLabel("Control count").fill(controlCount);
    if (explanation !== undefined) await this.page.getByLabel("Explanation of the difference").fill(explanation);
    await this.page.getByRole("button", { name: "Record the reconciliation" }).click();
  }

  async countAtOrAbove(amount: string) {
    await this.page.getByLabel(/^Amount/).fill(amount);
    await this.page.getByRole("button", { name: "Count items at or above" }).click();
    return this.page.getByTestId("threshold-result");
  }

  items() {
    return this.page.getByRole("table", { name: "Population items" });
  }

  async searchItems(text: string) {
    await this.page.getByLabel("Search items").fill(text);
  }
}
