import { readFile, writeFile } from "node:fs/promises";
import { expect, test, type Locator, type Page } from "@playwright/test";
import { generateLedgerCsv } from "../bench/generate-ledger";
import { SignInPage } from "./pages/sign-in-page";
import { LoadLedgerPage, PopulationProfilePage } from "./pages/populations-pages";

const ROWS = 2_000;
const TESSALY = /Tessaly Outdoor Supply/;

/** What the generated file holds, worked out here from its text (invoice,…,amount,currency per line). */
async function ledgerFacts(path: string) {
  const lines = (await readFile(path, "utf8")).trimEnd().split("\n").slice(1);
  const rows = lines.map((line) => {
    const fields = line.split(",");
    const [whole, frac] = fields[fields.length - 2].replace("-", "").split(".");
    const cents = (BigInt(whole) * 100n + BigInt(frac)) * (fields[fields.length - 2].startsWith("-") ? -1n : 1n);
    return { ref: fields[0], cents };
  });
  const total = rows.reduce((s, r) => s + r.cents, 0n);
  return { rows, total };
}

/** 1234567 cents → "12,345.67" as the screens show it. */
function shown(cents: bigint): string {
  const negative = cents < 0n;
  const abs = negative ? -cents : cents;
  const whole = (abs / 100n).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return `${negative ? "−" : ""}${whole}.${(abs % 100n).toString().padStart(2, "0")}`;
}

async function openTessaly(page: Page) {
  await page.getByRole("link", { name: TESSALY }).click();
  await expect(page.getByRole("heading", { name: "Financial statement audit FY2026" })).toBeVisible();
}

const shot = (page: Page, name: string) => page.screenshot({ path: test.info().outputPath(name), fullPage: true });
/** One panel only, so the picture shows what the step is about. */
const shotOf = (locator: Locator, name: string) => locator.screenshot({ path: test.info().outputPath(name) });
const card = (page: Page, title: string) =>
  page.locator("section").filter({ has: page.getByRole("heading", { name: title, exact: true }) });

test("a senior loads a ledger, reconciles it and reviews its profile", async ({ page }) => {
  test.setTimeout(120_000);
  const file = test.info().outputPath("tessaly-receivables.csv");
  await generateLedgerCsv(file, ROWS, 20260930);
  const facts = await ledgerFacts(file);
  expect(facts.rows).toHaveLength(ROWS);

  await new SignInPage(page).signInAndWait("senior");
  await openTessaly(page);
  const loader = new LoadLedgerPage(page);
  await loader.openFromEngagement();
  await shot(page, "01-load-empty.png");

  // Upload throttled to 40 KB/s so the byte-count bar can be seen moving.
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Network.emulateNetworkConditions", {
    offline: false,
    latency: 0,
    downloadThroughput: -1,
    uploadThroughput: 40 * 1024,
  });
  await page.getByLabel("Ledger file").setInputFiles(file);
  const uploading = page.getByRole("progressbar", { name: /^Uploading tessaly-receivables\.csv/ });
  await expect(uploading).toBeVisible();
  await expect(page.getByText(/ KB of 129 KB$/)).toBeVisible();
  await shot(page, "01b-uploading.png");
  await expect(page.getByRole("table", { name: "File preview" })).toBeVisible({ timeout: 20_000 });
  // The whole file's data rows, counted at upload, beside its size and columns (compare with the ledger's own count).
  await expect(page.getByText(`${facts.rows.length.toLocaleString("en-US")} data rows`)).toBeVisible();
  await cdp.send("Network.emulateNetworkConditions", {
    offline: false,
    latency: 0,
    downloadThroughput: -1,
    uploadThroughput: -1,
  });
  await expect(page.getByText("tessaly-receivables.csv")).toBeVisible();
  await loader.mapColumns({
    itemRef: "Invoice",
    bookValue: "Amount",
    description: "Customer",
    date: "Posted",
    keep: ["Currency"],
    name: "Trade receivables at 30 Sep 2026",
  });
  await expect(page.getByLabel("Number format")).toHaveValue("dot-decimal");
  await shot(page, "02-mapping.png");
  // A 2,000-row load is over in a blink: record what the progress panel showed on the way.
  await page.evaluate(() => {
    const seen: string[] = ((window as unknown as { __progressSeen: string[] }).__progressSeen = []);
    new MutationObserver(() => {
      const panel = document.querySelector("[data-testid=load-progress]");
      if (panel?.textContent) seen.push(panel.textContent);
    }).observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
  });
  await loader.load();
  await expect(page.getByText(`Loaded ${ROWS.toLocaleString("en-US")} items, total`)).toBeVisible({ timeout: 30_000 });
  const seen = await page.evaluate(() => (window as unknown as { __progressSeen: string[] }).__progressSeen);
  expect(
    seen.some((text) => text.includes("Reading and checking every row") && text.includes("Committing the population")),
  ).toBe(true);
  await expect(page.getByRole("status").filter({ hasText: "Loaded" })).toContainText(shown(facts.total));
  await shot(page, "03-loaded.png");

  await page.getByRole("link", { name: "Open the population and reconcile" }).click();
  const profile = new PopulationProfilePage(page);
  await expect(profile.status()).toContainText("Trade receivables at 30 Sep 2026");
  await expect(profile.status()).toContainText("Unreconciled");
  await expect(page.getByText("this population cannot be sampled yet")).toBeVisible();
  await expect(page.getByTestId("source-sha256")).toHaveText(/^[0-9a-f]{64}$/);
  await shot(page, "04-profile-unreconciled.png");

  // A control total 100.00 above what was loaded: the difference shows and the population stays unreconciled.
  const wrong = facts.total + 10_000n;
  await profile.reconcile((Number(wrong) / 100).toFixed(2), String(ROWS));
  await expect(page.getByTestId("difference-total")).toHaveText("100.00");
  await expect(page.getByLabel("Explanation of the difference")).toBeVisible();
  await expect(page.getByText("differ from what was loaded")).toBeVisible();
  await expect(profile.status()).toContainText("Unreconciled");
  await shotOf(card(page, "Reconciliation to the ledger"), "05-difference.png");

  await page
    .getByLabel("Explanation of the difference")
    .fill("Unapplied cash of 100.00 held in the suspense account; agreed to the client's bank reconciliation.");
  await page.getByRole("button", { name: "Record again" }).click();
  await expect(page.getByText(/^Reconciled by Priya Nair/)).toBeVisible();
  await expect(profile.status()).toContainText("Reconciled");
  await shotOf(card(page, "Reconciliation to the ledger"), "06-reconciled.png");

  // The threshold tool against a count made here from the file.
  const cut = 500_000n; // 5,000.00
  const above = facts.rows.filter((r) => r.cents >= cut);
  const result = await profile.countAtOrAbove("5000");
  await expect(result).toContainText(
    `${above.length.toLocaleString("en-US")} of ${ROWS.toLocaleString("en-US")} items`,
  );
  await expect(result).toContainText(shown(above.reduce((s, r) => s + r.cents, 0n)));
  await shotOf(card(page, "Items at or above an amount"), "07-threshold.png");

  // The items grid: a page of 50 from the server, searched and sorted there.
  await expect(page.getByTestId("items-range")).toHaveText(`1–25 of ${ROWS.toLocaleString("en-US")}`);
  const wanted = facts.rows[41];
  await profile.searchItems(wanted.ref);
  await expect(page.getByTestId("items-range")).toHaveText(`1–1 of 1 matching “${wanted.ref}”`);
  await expect(profile.items().getByRole("row").nth(1)).toContainText(shown(wanted.cents));
  await profile.searchItems("");
  await expect(page.getByTestId("items-range")).toHaveText(`1–25 of ${ROWS.toLocaleString("en-US")}`);
  await profile.items().getByRole("button", { name: "Book value" }).click();
  await profile.items().getByRole("button", { name: "Book value" }).click();
  const largest = facts.rows.reduce((m, r) => (r.cents > m ? r.cents : m), 0n);
  await expect(profile.items().getByRole("row").nth(1)).toContainText(shown(largest));
  await page.getByRole("button", { name: "Next" }).click();
  await expect(page.getByTestId("items-range")).toHaveText(`26–50 of ${ROWS.toLocaleString("en-US")}`);
  await shotOf(card(page, "Items"), "08-items.png");

  await page.getByRole("link", { name: /Tessaly Outdoor Supply Inc\. · / }).click();
  await expect(page.getByRole("table", { name: "Populations" })).toContainText("Trade receivables at 30 Sep 2026");
  await expect(page.getByRole("table", { name: "Populations" })).toContainText("Reconciled");
  await shot(page, "09-engagement-card.png");
});

test("a file with bad rows is refused row by row and nothing is stored", async ({ page }) => {
  const file = test.info().outputPath("bad-receivables.csv");
  await writeFile(
    file,
    [
      "Invoice,Customer,Amount",
      "INV-1,Alder Ltd,100.00",
      ",Birch & Co,200.00",
      "INV-3,Cedar Row,twelve",
      "INV-4,Dunmore,40.00",
      "",
    ].join("\n"),
  );
  await new SignInPage(page).signInAndWait("senior");
  await openTessaly(page);
  const before = await page
    .getByRole("table", { name: "Populations" })
    .getByRole("row")
    .count()
    .catch(() => 0);
  const loader = new LoadLedgerPage(page);
  await loader.openFromEngagement();
  await loader.chooseFile(file);
  await loader.mapColumns({
    itemRef: "Invoice",
    bookValue: "Amount",
    description: "Customer",
    name: "Receivables (bad file)",
  });
  await loader.load();
  await expect(page.getByText("2 problems were found in bad-receivables.csv. Nothing was stored.")).toBeVisible();
  const rows = loader.problems().getByRole("row");
  await expect(rows.nth(1)).toContainText("3");
  await expect(rows.nth(1)).toContainText("Invoice");
  await expect(rows.nth(2)).toContainText("4");
  await expect(rows.nth(2)).toContainText("twelve");
  await shot(page, "10-problems.png");

  const [download] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "Download all problems (CSV)" }).click(),
  ]);
  const csv = (await readFile(await download.path(), "utf8")).replace(/^\uFEFF/, ""); // a BOM, so spreadsheet programs read UTF-8
  expect(csv.split(/\r?\n/)[0]).toBe("Row,Column,Problem");
  expect(csv).toMatch(/^3,Invoice,/m);
  expect(csv).toMatch(/^4,Amount,/m);

  await page.getByRole("link", { name: "Financial statement audit FY2026" }).click();
  await expect(page.getByRole("table", { name: "Populations" }).getByRole("row")).toHaveCount(before);
  await expect(page.getByText("Receivables (bad file)")).toHaveCount(0);
});

test("a file that is not a ledger is refused whole with its reason", async ({ page }) => {
  const file = test.info().outputPath("header-only.csv");
  await writeFile(file, "Invoice,Amount\n");
  await new SignInPage(page).signInAndWait("senior");
  await openTessaly(page);
  const loader = new LoadLedgerPage(page);
  await loader.openFromEngagement();
  await page.getByLabel("Ledger file").setInputFiles(file);
  await expect(page.getByRole("alert").filter({ hasText: "nothing was stored" })).toContainText("no data rows");
  await shot(page, "11-refused-file.png");
});

test("staff see the populations but cannot load one", async ({ page }) => {
  await new SignInPage(page).signInAndWait("staff");
  await openTessaly(page);
  await expect(page.getByRole("link", { name: "Load a ledger" })).toHaveCount(0);
  await page.goto(page.url().replace(/\/?$/, "/populations/new"));
  await expect(page.getByRole("main").getByText("Loading a population needs the senior role")).toBeVisible();
  await expect(page.getByLabel("Ledger file")).toHaveCount(0);
  await shot(page, "12-staff-refused.png");
});

test("a workbook is read from the chosen sheet", async ({ page }) => {
  const ExcelJS = (await import("exceljs")).default;
  const wb = new ExcelJS.Workbook();
  wb.addWorksheet("Notes").addRow(["Prepared by the client for the FY2026 audit"]);
  const ws = wb.addWorksheet("Payables");
  ws.addRow(["Document", "Supplier", "Balance"]);
  ws.addRow(["PI-2001", "Harrow Mills", 1520.4]);
  ws.addRow(["PI-2002", "Quillon Freight", 860]);
  ws.addRow(["PI-2003", "Ostrander Paper", { formula: "200+45.5", result: 245.5 }]);
  const file = test.info().outputPath("tessaly-payables.xlsx");
  await wb.xlsx.writeFile(file);

  await new SignInPage(page).signInAndWait("senior");
  await openTessaly(page);
  const loader = new LoadLedgerPage(page);
  await loader.openFromEngagement();
  await loader.chooseFile(file);
  await expect(page.getByLabel("Sheet")).toHaveValue("Payables"); // the notes sheet is skipped
  await page.getByLabel("Sheet").selectOption("Notes");
  await expect(page.getByRole("main").getByRole("alert")).toContainText("Row 1 has only one column");
  await page.getByLabel("Sheet").selectOption("Payables");
  await expect(page.getByRole("table", { name: "File preview" })).toContainText("PI-2003");
  await loader.mapColumns({
    itemRef: "Document",
    bookValue: "Balance",
    description: "Supplier",
    name: "Trade payables at 30 Sep 2026",
  });
  await shot(page, "13-workbook-mapping.png");
  await loader.load();
  await expect(page.getByText("Loaded 3 items, total")).toBeVisible();
  await expect(page.getByRole("status").filter({ hasText: "Loaded" })).toContainText("2,625.90");
});
