import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { SamplePage } from "./pages/samples-pages";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

test.describe.configure({ mode: "serial" });

const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

interface Item {
  id: number;
  itemRef: string;
  bookValue: string;
  auditedValue: string | null;
  status: string;
  version: number;
}

let sampleUrl = "";
let api = "";

async function items(page: Page): Promise<Item[]> {
  return (await (await page.request.get(`${api}/items?pageSize=200`)).json()).items as Item[];
}

/** Pastes text into the focused element as a spreadsheet would put it on the clipboard. */
async function paste(page: Page, text: string) {
  await page.evaluate((t) => {
    const data = new DataTransfer();
    data.setData("text/plain", t);
    document.activeElement!.dispatchEvent(
      new ClipboardEvent("paste", { clipboardData: data, bubbles: true, cancelable: true }),
    );
  }, text);
}

test.beforeAll(async ({ browser }) => {
  const page = await browser.newPage();
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 300,
    seed: 1919,
    name: "Receivables for keyed entry",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables existence (keyed entry)",
      objective: "Confirm recorded receivables exist at the period end.",
      assertion: "Existence",
      direction: "overstatement",
      params: {
        method: "random",
        confidence: 0.95,
        tolerableMisstatement: (Number(population.total) / 8).toFixed(2),
        expectedMisstatement: "0",
        estimator: "difference",
        sampleSize: 30,
        sizeReason: "keyed-entry e2e",
      },
    },
  });
  expect(planned.status(), await planned.text()).toBe(201);
  const sampleId = (await planned.json()).sample.id as number;
  expect(
    (
      await page.request.post(`/api/engagements/${engagementId}/samples/${sampleId}/draw`, { data: { seed: 191919 } })
    ).status(),
  ).toBe(201);
  sampleUrl = `/engagements/${engagementId}/samples/${sampleId}`;
  api = `/api${sampleUrl}`;
  await page.close();
});

test("Enter saves and moves down, Tab walks the editable cells, a pasted column saves in one go, and the last save can be undone", async ({
  page,
}) => {
  await as(page, "staff");
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(sampleUrl);
  const sample = new SamplePage(page);
  await sample.open("Results and evaluation");
  const list = await items(page);
  const [a, b, c, d, e] = list;

  // Enter in an audited value saves the row and lands in the audited value of the next row.
  const auditedA = sample.row(a.itemRef).getByLabel(`Audited value of ${a.itemRef}`);
  await auditedA.fill(a.bookValue);
  await auditedA.press("Enter");
  await expect(sample.row(b.itemRef).getByLabel(`Audited value of ${b.itemRef}`)).toBeFocused();
  await expect(sample.row(a.itemRef).getByRole("button", { name: `Save ${a.itemRef}` })).toHaveText("Saved");
  await expect(page.getByTestId("undo-bar")).toContainText(`Saved ${a.itemRef}.`);

  // Tab goes from the audited value to the next editable cell (status), never to a button.
  await page.keyboard.press("Tab");
  await expect(sample.row(b.itemRef).getByLabel(`Status of ${b.itemRef}`)).toBeFocused();
  await page.keyboard.press("Tab");
  await expect(sample.row(b.itemRef).getByLabel(`Cause of misstatement in ${b.itemRef}`)).toBeFocused();
  await page.keyboard.press("Tab");
  await expect(sample.row(b.itemRef).getByLabel(`Comment on ${b.itemRef}`)).toBeFocused();
  await page.keyboard.press("Tab");
  await expect(sample.row(c.itemRef).getByLabel(`Audited value of ${c.itemRef}`)).toBeFocused();

  // A column of three values pasted into row b fills b, c and d in one save, an audit row each.
  const pasted = ["1,000.00", "(25.50)", "0"];
  await sample.row(b.itemRef).getByLabel(`Audited value of ${b.itemRef}`).focus();
  await paste(page, `${pasted.join("\r\n")}\r\n`);
  await expect(page.getByTestId("undo-bar")).toContainText(
    `Pasted 3 audited values into ${b.itemRef} to ${d.itemRef}.`,
  );
  await expect(sample.row(c.itemRef).getByLabel(`Audited value of ${c.itemRef}`)).toHaveValue("-25.50");
  await shot(page, "1-pasted-column-1440");
  let now = await items(page);
  expect(now.slice(1, 4).map((i) => [i.status, i.auditedValue])).toEqual([
    ["done", "1000.00"],
    ["done", "-25.50"],
    ["done", "0.00"],
  ]);
  const { entries } = (await (await page.request.get(`${api}/audit`)).json()) as {
    entries: { entity: string; entityId: string; action: string }[];
  };
  const pastedIds = [b.id, c.id, d.id].map(String);
  expect(
    entries.filter((x) => x.action === "record-result" && pastedIds.includes(x.entityId)).length,
    "one audit row per pasted item",
  ).toBe(3);

  // Undo puts the three rows back as they were, as a new recorded change.
  await page.getByTestId("undo-bar").getByRole("button", { name: /Undo/ }).click();
  await expect(page.getByText("Undone: 3 items back as before (recorded in the audit trail).")).toBeVisible();
  now = await items(page);
  expect(now.slice(1, 4).map((i) => i.status)).toEqual(["not-started", "not-started", "not-started"]);
  await expect(sample.row(c.itemRef).getByLabel(`Audited value of ${c.itemRef}`)).toHaveValue("");

  // A pasted column with text in it is refused naming the row; nothing is saved.
  await sample.row(b.itemRef).getByLabel(`Audited value of ${b.itemRef}`).focus();
  await paste(page, "12.00\r\nabc\r\n");
  await expect(
    page
      .getByRole("alert")
      .filter({ hasText: `Nothing was saved. One row was refused — ${c.itemRef}: Audited value:` }),
  ).toBeVisible();
  expect((await items(page)).slice(1, 3).map((i) => i.status)).toEqual(["not-started", "not-started"]);
  await shot(page, "2-paste-refused-1440");

  // Tick two rows and mark them agreed to book.
  await sample.row(d.itemRef).getByLabel(`Select ${d.itemRef}`).check();
  await sample.row(e.itemRef).getByLabel(`Select ${e.itemRef}`).check();
  await page.getByRole("button", { name: "Agreed to book (2)" }).click();
  await expect(page.getByTestId("undo-bar")).toContainText("Marked 2 items as agreed to book.");
  now = await items(page);
  expect(now.slice(3, 5).map((i) => [i.status, i.auditedValue])).toEqual([
    ["done", d.bookValue],
    ["done", e.bookValue],
  ]);
});

test("evidence is attached from the item's row, and the grid keeps its actions in view at 1280, 1440 and 1920 px", async ({
  page,
}) => {
  await as(page, "staff");
  await page.goto(sampleUrl);
  const sample = new SamplePage(page);
  await sample.open("Results and evaluation");
  const [first] = await items(page);
  // ISO 32000-1:2008 §7.5.2: a PDF file begins with "%PDF-1.n".
  await sample
    .row(first.itemRef)
    .getByTestId(`attach-${first.itemRef}`)
    .setInputFiles({
      name: "confirmation.pdf",
      mimeType: "application/pdf",
      buffer: Buffer.from("%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n"),
    });
  await expect(page.getByText(`Attached confirmation.pdf to ${first.itemRef}.`)).toBeVisible();
  await expect(
    page.getByTestId(`evidence-of-${first.itemRef}`).getByRole("link", { name: "confirmation.pdf" }),
  ).toBeVisible();
  await expect(
    sample.row(first.itemRef).getByRole("button", { name: `Evidence of ${first.itemRef}: 1 file` }),
  ).toBeVisible();

  for (const width of [1280, 1440, 1920]) {
    await page.setViewportSize({ width, height: 1000 });
    const save = sample.row(first.itemRef).getByRole("button", { name: `Save ${first.itemRef}` });
    await expect(save).toBeInViewport();
    const box = await save.boundingBox();
    expect(box!.x + box!.width, `Save is inside the window at ${width} px`).toBeLessThanOrEqual(width);
    await shot(page, `3-grid-${width}`);
  }
});
