import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { ReviewPanelPage } from "./pages/review-panel";
import { LoadLedgerPage } from "./pages/populations-pages";
import { engagementIdByClient, loadReconciledLedger, LEDGER_MAPPING } from "./pages/samples-population";
import { NewRequestListPage, waitForMail } from "./pages/requests-pages";

test.describe.configure({ mode: "serial" });

const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });
const WIDTHS = [1280, 1440, 1920];

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

const CONTACT = { name: "Ruth Calloway", email: "ruth.calloway@tessaly-outdoor.example" };

test("the manager's inbox counts the sample awaiting review; lock asks first, naming the open request list, and the contact is told it closed", async ({
  page,
}) => {
  test.setTimeout(240_000);
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 200,
    seed: 1920,
    name: "Receivables for the inbox",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables existence (inbox and lock)",
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
  const api = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const url = `/engagements/${engagementId}/samples/${sampleId}`;
  expect((await page.request.post(`${api}/draw`, { data: { seed: 192019 } })).status()).toBe(201);
  const { items } = await (await page.request.get(`${api}/items?pageSize=200`)).json();

  // The senior sends a request list to a new contact, records every result and the conclusion, and signs off as preparer.
  await page.goto(`${url}/requests/new`);
  const form = new NewRequestListPage(page);
  await form.inviteContact(CONTACT.name, CONTACT.email);
  await form.send({
    title: "Inbox run — remittances",
    itemRefs: [items[0].itemRef],
    needs: ["Remittance advice or proof of payment"],
    message: "Please send what you have.",
  });
  await expect(page.getByRole("heading", { name: "Inbox run — remittances" })).toBeVisible();
  const rows = items.map((it: { id: number; version: number; bookValue: string }) => ({
    itemId: it.id,
    version: it.version,
    status: "done",
    auditedValue: it.bookValue,
  }));
  expect((await page.request.post(`${api}/results`, { data: { rows } })).status()).toBe(200);
  // Issue 13: the auditor's conclusion is recorded before the preparer signs off.
  const concluded = await page.request.put(`${api}/conclusion`, {
    data: {
      conclusion: "No misstatement found; the balance is fairly stated.",
      responses: [{ kind: "alternative-procedures", note: "Subsequent receipts agreed" }],
    },
  });
  expect(concluded.status(), await concluded.text()).toBe(200);
  expect((await page.request.post(`${api}/sign-off`, { data: { as: "preparer" } })).status()).toBe(200);

  // The manager sees it counted on the top bar and listed in the inbox.
  await as(page, "manager");
  await page.goto("/engagements");
  await expect(page.getByTestId("inbox-count")).toBeVisible();
  const waiting = Number(await page.getByTestId("inbox-count").textContent());
  expect(waiting).toBeGreaterThanOrEqual(1);
  await page.getByRole("link", { name: /^Inbox/ }).click();
  const entry = page
    .getByRole("table", { name: "Samples waiting for you" })
    .getByRole("row")
    .filter({ hasText: "Receivables existence (inbox and lock)" });
  await expect(entry).toContainText("Review and sign off");
  await expect(entry).toContainText("Tessaly Outdoor Supply Inc.");
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: 900 });
    await shot(page, `1-inbox-${width}`);
  }
  await entry.getByRole("link", { name: "Receivables existence (inbox and lock)" }).click();

  // Lock is disabled (and says why) until the reviewer signs off; then it asks first.
  const review = new ReviewPanelPage(page);
  await expect(page.getByRole("button", { name: "Lock sample…" })).toBeDisabled();
  await expect(page.getByText("A reviewer signs off before the sample is locked.")).toBeVisible();
  await review.signOff("reviewer");
  await expect(page.getByRole("button", { name: "Signed off as reviewer" })).toBeDisabled();
  const dialog = await review.openLockDialog();
  await expect(dialog).toContainText("render the signed-off workpaper (PDF) once");
  await expect(dialog.getByTestId("lists-to-close")).toContainText(
    `“Inbox run — remittances” (sent to ${CONTACT.name})`,
  );
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: 900 });
    await shot(page, `2-lock-confirmation-${width}`);
  }
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(dialog).toBeHidden();
  const sha = await review.lock();
  expect(sha).toMatch(/^[0-9a-f]{64}$/);
  const closed = await waitForMail(CONTACT.email, /^Request list closed: Inbox run — remittances$/);
  expect(closed.text.replace(/\s+/g, " ")).toContain("no longer takes files on it");

  // Locked, it leaves the inbox.
  await page.goto("/inbox");
  await expect(page.getByRole("main").getByText("Receivables existence (inbox and lock)")).toHaveCount(0);
});

test("replacing a population that a sample uses warns first, naming the sample, and the sample then shows a superseded banner", async ({
  page,
}) => {
  test.setTimeout(240_000);
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 120,
    seed: 1921,
    name: "Receivables to be corrected",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables cut-off (superseded run)",
      objective: "Test cut-off of receivables.",
      assertion: "Cut-off",
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

  // The corrected file: the same generator, another seed.
  await page.goto(`/engagements/${engagementId}/populations/new`);
  const loader = new LoadLedgerPage(page);
  await loader.chooseFile(test.info().outputPath("ledger.csv"));
  await loader.mapColumns({
    itemRef: LEDGER_MAPPING.itemRefColumn,
    bookValue: LEDGER_MAPPING.bookValueColumn,
    description: LEDGER_MAPPING.descriptionColumn,
    name: "Receivables, corrected file",
  });
  await page
    .getByLabel("Replaces a population")
    .selectOption({ label: `Yes — replaces “Receivables to be corrected” (120 items)` });
  const warning = page.getByTestId("supersede-warning");
  await expect(warning).toContainText("“Receivables to be corrected” is used by 1 sample:");
  await expect(warning).toContainText("Receivables cut-off (superseded run)");
  await expect(page.getByRole("button", { name: "Check and load" })).toBeDisabled();
  await shot(page, "3-supersede-warning-1440");
  await warning.getByLabel("Replace it anyway").check();
  await loader.load();
  await expect(page.getByRole("link", { name: "Open the population and reconcile" })).toBeVisible({ timeout: 30_000 });

  await page.goto(`/engagements/${engagementId}/samples/${sampleId}`);
  const banner = page.getByTestId("superseded-banner");
  await expect(banner).toContainText("The population of this sample was superseded.");
  await expect(banner.getByRole("link", { name: "Receivables, corrected file" })).toBeVisible();
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: 900 });
    await shot(page, `4-superseded-banner-${width}`);
  }
});
