import { expect, type Page } from "@playwright/test";
import { E2E_INBOX_URL } from "../slot";

interface Message {
  to: string[];
  subject: string;
  text: string;
}

/** Polls the e2e server's fake inbox for a message to `email` whose subject matches. */
export async function waitForMail(email: string, subject: RegExp, timeoutMs = 10_000): Promise<Message> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const messages = (await (await fetch(E2E_INBOX_URL)).json()) as Message[];
    const found = messages.find(
      (m) => m.to.some((t) => t.toLowerCase() === email.toLowerCase()) && subject.test(m.subject),
    );
    if (found) return found;
    if (Date.now() > deadline)
      throw new Error(
        `no mail to ${email} matching ${subject}; inbox: ${messages.map((m) => `${m.to.join(", ")}: ${m.subject}`).join("; ")}`,
      );
    await new Promise((r) => setTimeout(r, 200));
  }
}

export async function signInWith(page: Page, email: string, password: string, name: string) {
  await page.context().clearCookies();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-as")).toHaveText(name);
}

/** The senior's form for a new request list, with its invite-a-contact panel. */
export class NewRequestListPage {
  constructor(private readonly page: Page) {}

  async inviteContact(name: string, email: string) {
    const form = this.page.getByRole("form", { name: "Invite a client contact" });
    await form.getByLabel("Contact's name").fill(name);
    await form.getByLabel("Contact's e-mail").fill(email);
    await form.getByRole("button", { name: "Invite the contact" }).click();
    await expect(form.getByText(`${name} was invited`)).toBeVisible();
  }

  async send(a: { title: string; itemRefs: string[]; needs: string[]; message: string }) {
    const form = this.page.getByRole("form", { name: "New request list" });
    await form.getByLabel("Title").fill(a.title);
    for (const need of a.needs) await form.getByLabel(need).check();
    await form.getByLabel("Only the items I tick").check();
    for (const ref of a.itemRefs) await form.getByLabel(`Ask for ${ref}`).check();
    await form.getByLabel("Message to the client (optional)").fill(a.message);
    await form.getByRole("button", { name: "Send the request list" }).click();
  }
}

/** The client's page of one request list. */
export class ClientRequestPage {
  constructor(private readonly page: Page) {}

  item(itemRef: string) {
    return this.page
      .getByRole("listitem")
      .filter({ has: this.page.getByRole("heading", { name: new RegExp(itemRef) }) });
  }

  async upload(itemRef: string, files: { name: string; mimeType: string; buffer: Buffer }[]) {
    const item = this.item(itemRef);
    await item.getByLabel(`Files for ${itemRef}`).setInputFiles(files);
    await item.getByRole("button", { name: files.length > 1 ? `Upload ${files.length} files` : "Upload" }).click();
    await expect(
      item.getByText(`${files.length} file${files.length === 1 ? "" : "s"} sent to the audit team.`),
    ).toBeVisible();
  }

  async note(itemRef: string, text: string) {
    const item = this.item(itemRef);
    await item.getByLabel(`Note for ${itemRef}`).fill(text);
    await item.getByRole("button", { name: "Save note" }).click();
    await expect(item.getByText("Note saved.")).toBeVisible();
  }
}

/** The audit team's page of one request list. */
export class TeamRequestPage {
  constructor(private readonly page: Page) {}

  row(itemRef: string) {
    return this.page.getByRole("table", { name: "Requested items" }).getByRole("row").filter({ hasText: itemRef });
  }

  async accept(fileName: string) {
    await this.page.getByRole("button", { name: `Accept ${fileName}` }).click();
    await expect(this.page.getByText(`${fileName} accepted: it is now evidence on the item.`)).toBeVisible();
  }

  async sendBack(fileName: string, reason: string) {
    await this.page.getByRole("button", { name: `Send back ${fileName}` }).click();
    await this.page.getByLabel(`What is missing or wrong in ${fileName}`).fill(reason);
    await this.page.getByRole("button", { name: "Send back to the client" }).click();
    await expect(this.page.getByText(`${fileName} sent back; the client has been e-mailed the reason.`)).toBeVisible();
  }
}
