import { expect, type Page } from "@playwright/test";

/** The review panel of a sample: sign-offs, notes, lock. */
export class ReviewPanelPage {
  constructor(readonly page: Page) {}

  panel() {
    return this.page.getByRole("region", { name: "Review notes" });
  }

  /** The preparer records the auditor's conclusion (and responses, by their labels) in the review panel. */
  async conclude(text: string, responses: { label: string; amount?: string }[] = []) {
    await this.page.getByRole("textbox", { name: "Conclusion, in your words" }).fill(text);
    for (const r of responses) {
      await this.page.getByRole("checkbox", { name: r.label }).check();
      if (r.amount !== undefined) await this.page.getByRole("textbox", { name: `Amount: ${r.label}` }).fill(r.amount);
    }
    await this.page.getByRole("button", { name: /(Record|Update) the conclusion/ }).click();
    await expect(this.page.getByText(/Conclusion recorded/)).toBeVisible();
  }

  async signOff(as: "preparer" | "reviewer") {
    await this.page.getByRole("button", { name: `Sign off as ${as}` }).click();
    // The panel's own message (the button then reads "Signed off as …", disabled, with why beside it).
    await expect(
      this.page.getByRole("status").filter({
        hasText:
          as === "preparer" ? "Signed off as preparer; the reviewers have been told." : /^Signed off as reviewer\.$/,
      }),
    ).toBeVisible();
  }

  async raiseNote(text: string) {
    await this.page.getByRole("textbox", { name: "New review note" }).fill(text);
    await this.page.getByRole("button", { name: "Raise note" }).click();
    await expect(this.page.getByTestId("review-note-1")).toContainText(text);
  }

  async answerNote(n: number, answer: string) {
    await this.page.getByRole("textbox", { name: `Answer to note ${n}` }).fill(answer);
    await this.page.getByTestId(`review-note-${n}`).getByRole("button", { name: "Send answer" }).click();
    await expect(this.page.getByTestId(`review-note-${n}`)).toContainText("Answered");
  }

  async clearNote(n: number) {
    await this.page.getByTestId(`review-note-${n}`).getByRole("button", { name: "Clear" }).click();
    await expect(this.page.getByTestId(`review-note-${n}`)).toContainText("Cleared");
  }

  /** Opens the lock confirmation, which says what locking will do. */
  async openLockDialog() {
    await this.page.getByRole("button", { name: "Lock sample…" }).click();
    const dialog = this.page.getByRole("dialog", { name: "Lock this sample?" });
    await expect(dialog).toBeVisible();
    return dialog;
  }

  async lock() {
    const dialog = await this.openLockDialog();
    await dialog.getByRole("button", { name: "Lock the sample" }).click();
    await expect(this.page.getByTestId("workpaper-sha256")).toBeVisible({ timeout: 30_000 });
    return (await this.page.getByTestId("workpaper-sha256").textContent())!.trim();
  }
}
