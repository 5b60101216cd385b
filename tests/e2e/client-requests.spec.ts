import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { SamplePage } from "./pages/samples-pages";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";
import {
  ClientRequestPage,
  NewRequestListPage,
  signInWith,
  TeamRequestPage,
  waitForMail,
} from "./pages/requests-pages";

test.describe.configure({ mode: "serial" });

const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

const CONTACT = {
  name: "Dana Whitlock",
  email: "dana.whitlock@tessaly-outdoor.example",
  password: "dana-chose-this-2026",
};
// ISO 32000-1:2008 §7.5.2: a PDF file begins with "%PDF-1.n".
const pdf = (text: string) =>
  Buffer.from(`%PDF-1.7\n% ${text}\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n`);

test("invite a client contact, who uploads per item; the team sends one file back and accepts another as evidence", async ({
  page,
}) => {
  test.setTimeout(180_000);
  // Set-up through the API as the senior: a reconciled ledger and a drawn monetary-unit sample.
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 300,
    seed: 91,
    name: "Receivables for client requests",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables existence (client requests)",
      objective: "Confirm recorded receivables exist at the period end.",
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
      await page.request.post(`/api/engagements/${engagementId}/samples/${sampleId}/draw`, { data: { seed: 20261203 } })
    ).status(),
  ).toBe(201);
  const { items } = await (
    await page.request.get(`/api/engagements/${engagementId}/samples/${sampleId}/items?pageSize=200`)
  ).json();
  const [first, second] = items as { itemRef: string; bookValue: string }[];
  const sampleUrl = `/engagements/${engagementId}/samples/${sampleId}`;

  // The senior invites a new client contact and sends a list for two items.
  await page.goto(sampleUrl);
  await page.getByRole("link", { name: "Ask the client for evidence" }).click();
  await expect(page.getByRole("heading", { name: "Ask the client for evidence" })).toBeVisible();
  const form = new NewRequestListPage(page);
  await form.inviteContact(CONTACT.name, CONTACT.email);
  await form.send({
    title: "Year-end receivables — documents",
    itemRefs: [first.itemRef, second.itemRef],
    needs: ["Remittance advice or proof of payment"],
    message: "Please send what you have by the due date.",
  });
  await expect(page.getByRole("heading", { name: "Year-end receivables — documents" })).toBeVisible();
  await expect(new TeamRequestPage(page).row(first.itemRef).getByText("Requested")).toBeVisible();
  await shot(page, "1-senior-sent-list");

  // The invitation and the list arrive; the contact chooses a password with the link.
  const invitation = await waitForMail(CONTACT.email, /invites you to share audit evidence/);
  const link = /(http\S+\/invitation\/[A-Za-z0-9_-]+)/.exec(invitation.text)?.[1];
  expect(link).toBeTruthy();
  const listMail = await waitForMail(CONTACT.email, /Documents requested: Year-end receivables — documents/);
  const listPath = new URL(/(http\S+\/requests\/\d+)/.exec(listMail.text)![1]).pathname;
  await page.context().clearCookies();
  await page.goto(new URL(link!).pathname);
  await page.getByLabel("New password").fill(CONTACT.password);
  await page.getByLabel("Repeat the password").fill(CONTACT.password);
  await shot(page, "2-invitation");
  await page.getByRole("button", { name: "Save my password" }).click();
  await expect(page.getByText("Your password is saved. Sign in with it now.")).toBeVisible();
  await signInWith(page, CONTACT.email, CONTACT.password, CONTACT.name);
  await expect(page).toHaveURL(/\/requests$/);
  await page.getByRole("link", { name: "Year-end receivables — documents" }).click();
  await expect(page).toHaveURL(new RegExp(`${listPath}$`));

  // The client sees the two items without book values, uploads two files at once for one, and a note for the other.
  const client = new ClientRequestPage(page);
  await expect(client.item(first.itemRef)).toBeVisible();
  await expect(page.getByText("Amount in the ledger")).toHaveCount(0);
  await client.upload(first.itemRef, [
    { name: "remittance-march.pdf", mimeType: "application/pdf", buffer: pdf("remittance") },
    { name: "bank-line.csv", mimeType: "text/csv", buffer: Buffer.from("date,amount\n2026-10-04,1250.00\n") },
  ]);
  await expect(client.item(first.itemRef).getByText("Provided")).toBeVisible();
  await client.note(second.itemRef, "This customer paid in cash; the receipt book is at the warehouse.");
  await shot(page, "3-client-uploaded");
  // The client is shown not-found in the audit workspace.
  await page.goto(sampleUrl);
  await expect(page).toHaveURL(/\/requests$/);

  // Staff send the CSV back with a reason and accept the PDF: it becomes evidence on the item.
  await as(page, "staff");
  await page.goto(`${sampleUrl}${listPath}`); // the team's page of the same list
  const team = new TeamRequestPage(page);
  await expect(team.row(first.itemRef).getByText("Provided")).toBeVisible();
  await expect(team.row(second.itemRef).getByText("receipt book is at the warehouse")).toBeVisible();
  await team.sendBack("bank-line.csv", "The extract does not show the customer's name; send the bank statement page.");
  await team.accept("remittance-march.pdf");
  await expect(team.row(first.itemRef).getByText("Accepted", { exact: true })).toBeVisible();
  await shot(page, "4-team-decided");
  const back = await waitForMail(CONTACT.email, new RegExp(`More needed for ${first.itemRef}`));
  expect(back.text).toContain("does not show the customer's name");

  // The sample grid shows the request status per item, and the file among the item's evidence.
  await page.goto(sampleUrl);
  const sample = new SamplePage(page);
  await sample.open("Results and evaluation");
  const grid = page.getByRole("table", { name: "Sample items" });
  await expect(grid.getByRole("columnheader", { name: "Evidence" })).toBeVisible(); // the request status shows under the evidence count
  await expect(grid.getByRole("row").filter({ hasText: first.itemRef }).getByText("Accepted")).toBeVisible();
  await expect(grid.getByRole("row").filter({ hasText: second.itemRef }).getByText("Requested")).toBeVisible();
  await shot(page, "5-grid-request-status");
  const evidence = await (
    await page.request.get(`/api/engagements/${engagementId}/samples/${sampleId}/items/${items[0].id}/evidence`)
  ).json();
  expect(evidence.evidence.map((e: { fileName: string }) => e.fileName)).toEqual(["remittance-march.pdf"]);
});
