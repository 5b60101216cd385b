import { expect, test } from "@playwright/test";
import { DEMO, SignInPage, type DemoRole } from "./pages/sign-in-page";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";

// Which demo engagements each demo person is on (the invented scenario in db/seeds/demo-scenario.ts).
const VISIBLE: Record<Exclude<DemoRole, "client">, string[]> = {
  admin: [],
  partner: ["Tessaly Outdoor Supply Inc.", "Bramblecote Water Authority"],
  manager: ["Tessaly Outdoor Supply Inc.", "Bramblecote Water Authority"],
  senior: ["Tessaly Outdoor Supply Inc."],
  senior2: ["Bramblecote Water Authority"],
  staff: ["Tessaly Outdoor Supply Inc."],
};
const ALL_CLIENTS = ["Tessaly Outdoor Supply Inc.", "Bramblecote Water Authority"];

test("a signed-out visitor is sent to sign-in", async ({ page }) => {
  await page.goto("/engagements");
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fengagements/);
  await expect(page.getByRole("heading", { name: "Sign in to your firm’s workspace" })).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("sign-in.png"), fullPage: true });
});

test("a wrong password is refused with a clear message", async ({ page }) => {
  await new SignInPage(page).signIn("staff", "not-the-password");
  await expect(page.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
});

for (const role of Object.keys(VISIBLE) as (keyof typeof VISIBLE)[]) {
  test(`${role} sees only their own engagements`, async ({ page }) => {
    const signIn = new SignInPage(page);
    await signIn.signInAndWait(role);
    if (role === "admin") {
      // The administrator lands on the people page (issue 19), and reaches the engagements from the top bar.
      await expect(page).toHaveURL(/\/admin\/users$/);
      await page.goto("/engagements");
    }
    await expect(page.getByRole("heading", { name: "Engagements" })).toBeVisible();
    await expect(page.getByRole("table", { name: "Engagements" })).toBeVisible();
    if (VISIBLE[role].length === 0) await expect(page.getByText("You are not on any engagement yet")).toBeVisible();
    for (const client of ALL_CLIENTS) {
      const link = page.getByRole("link", { name: new RegExp(client) });
      if (VISIBLE[role].includes(client)) await expect(link).toBeVisible();
      else await expect(link).toHaveCount(0);
    }
    await page.screenshot({ path: test.info().outputPath(`engagements-${role}.png`), fullPage: true });
    await signIn.signOut();
  });
}

test("the client contact lands on their own requests and is shown not-found anywhere in the audit workspace", async ({
  page,
}) => {
  const signIn = new SignInPage(page);
  await signIn.signInAndWait("client");
  await expect(page).toHaveURL(/\/requests$/);
  await expect(page.getByRole("heading", { name: "Documents your auditors asked for" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Engagements" })).toHaveCount(0);
  await page.goto("/engagements");
  await expect(page).toHaveURL(/\/requests$/);
  const engagements = await (await page.request.get("/api/engagements")).json();
  expect(engagements.engagements).toEqual([]);
  await page.screenshot({ path: test.info().outputPath("client-home.png"), fullPage: true });
  await signIn.signOut();
});

test("a manager creates an engagement and lands on its overview", async ({ page }) => {
  await new SignInPage(page).signInAndWait("manager");
  await page.getByRole("link", { name: "New engagement" }).click();
  await page.getByLabel("Client").fill("Kestrel Ridge Cooperative");
  await page.getByLabel("Engagement name").fill("Year-end audit FY2026");
  await page.getByLabel("Period end").fill("2026-12-31");
  await page.getByLabel("Overall materiality").fill("250000");
  await page.getByLabel("Performance materiality").fill("300000");
  await page.getByRole("button", { name: "Create engagement" }).click();
  await expect(page.getByText("Performance materiality cannot exceed overall materiality")).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("create-engagement-error.png"), fullPage: true });
  await page.getByLabel("Performance materiality").fill("187500");
  await page.getByRole("button", { name: "Create engagement" }).click();
  await expect(page.getByRole("heading", { name: "Year-end audit FY2026" })).toBeVisible();
  await expect(page.getByText("187,500.00")).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("engagement-overview.png"), fullPage: true });
  await page.getByRole("link", { name: "Manage" }).click();
  await expect(page.getByRole("table", { name: "Team" }).getByText(DEMO.manager.name)).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("team.png"), fullPage: true });
});

test("staff cannot create an engagement", async ({ page }) => {
  await new SignInPage(page).signInAndWait("staff");
  await expect(page.getByRole("link", { name: "New engagement" })).toHaveCount(0);
  await page.goto("/engagements/new");
  // By role: Next can keep a hidden copy of the previous render in the DOM for a moment.
  await expect(
    page.getByRole("alert").filter({ hasText: "Only managers and partners can create engagements." }),
  ).toBeVisible();
  await expect(page.getByRole("button", { name: "Create engagement" })).toHaveCount(0);
  await page.screenshot({ path: test.info().outputPath("staff-cannot-create.png"), fullPage: true });
});

test("the firm admin sees the people list", async ({ page }) => {
  await new SignInPage(page).signInAndWait("admin");
  await expect(page).toHaveURL(/\/admin\/users$/);
  await expect(page.getByRole("table", { name: "People" }).getByText(DEMO.staff.email)).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("people.png"), fullPage: true });
});

test("the engagement's samples table keeps each status badge on one line at 1280, 1440 and 1920 px", async ({
  page,
}) => {
  await new SignInPage(page).signInAndWait("senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 60,
    seed: 1280,
    name: "Receivables for the badge check",
  });
  const plan = (name: string) =>
    page.request.post(`/api/engagements/${engagementId}/samples`, {
      data: {
        populationId: population.id,
        name,
        objective: "Confirm recorded receivables exist at the period end.",
        assertion: "Existence",
        direction: "overstatement",
        params: { method: "mus", confidence: 0.95, tolerableMisstatement: "50000.00", factorMode: "table" },
      },
    });
  expect((await plan("Badge check — planned")).status()).toBe(201);
  const drawn = (await (await plan("Badge check — drawn")).json()).sample.id as number;
  expect(
    (await page.request.post(`/api/engagements/${engagementId}/samples/${drawn}/draw`, { data: { seed: 1 } })).status(),
  ).toBe(201);
  await page.goto(`/engagements/${engagementId}`);
  const samples = page.getByRole("table", { name: "Samples" });
  const planned = samples.getByText("Planned, not drawn", { exact: true });
  const oneWord = samples.getByText("Drawn", { exact: true }).first();
  await expect(planned.first()).toBeVisible();
  for (const width of [1280, 1440, 1920]) {
    await page.setViewportSize({ width, height: 900 });
    // A wrapped badge is two lines tall; a one-word badge is always one line.
    const oneLine = (await oneWord.boundingBox())!.height;
    for (const badge of await planned.all())
      expect((await badge.boundingBox())!.height).toBeLessThanOrEqual(oneLine + 1);
    await samples.screenshot({ path: test.info().outputPath(`samples-table-${width}.png`) });
  }
});
