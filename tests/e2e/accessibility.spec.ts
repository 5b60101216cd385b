import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { SignInPage, type DemoRole } from "./pages/sign-in-page";
import { engagementIdByClient, loadReconciledLedger } from "./pages/samples-population";
import { NewRequestListPage, waitForMail } from "./pages/requests-pages";

// WCAG 2.1 level A and AA success criteria, as axe-core tags them (axe-core rule descriptions, "Tags").
const WCAG_AA_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];

test.describe.configure({ mode: "serial" });

async function as(page: Page, role: DemoRole) {
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait(role);
}

/** Scans the page as it stands; any violation fails the test with the rule, the impact and the elements. */
async function expectNoViolations(page: Page, label: string) {
  await page.waitForLoadState("networkidle");
  const { violations } = await new AxeBuilder({ page }).withTags(WCAG_AA_TAGS).analyze();
  const report = violations.map(
    (v) =>
      `${v.id} (${v.impact}): ${v.help}\n${v.nodes
        .slice(0, 5)
        .map((n) => `   ${n.target.join(" ")} — ${n.failureSummary?.split("\n").slice(1, 2).join("")}`)
        .join("\n")}${v.nodes.length > 5 ? `\n   … and ${v.nodes.length - 5} more` : ""}`,
  );
  expect.soft(report, `${label}: WCAG 2.1 A/AA violations`).toEqual([]);
}

async function scan(page: Page, path: string, label: string) {
  await page.goto(path);
  await expect(page.locator("main").first()).toBeVisible();
  await expectNoViolations(page, label);
}

const CONTACT = { name: "Ines Okafor", email: "ines.okafor@tessaly-outdoor.example", password: "ines-chose-this-2026" };

test("every page meets WCAG 2.1 A/AA as axe-core checks it (auditor, administrator and client screens)", async ({
  page,
}) => {
  test.setTimeout(300_000);
  await page.setViewportSize({ width: 1440, height: 900 });

  // Signed out.
  await page.context().clearCookies();
  await scan(page, "/sign-in", "sign-in");

  // Data to look at: a reconciled ledger, a drawn sample with a first result, and a request list.
  await as(page, "senior");
  const engagementId = await engagementIdByClient(page.request, "Tessaly Outdoor Supply Inc.");
  const population = await loadReconciledLedger(page.request, {
    engagementId,
    path: test.info().outputPath("ledger.csv"),
    rows: 200,
    seed: 404,
    name: "Receivables for the accessibility scan",
  });
  const planned = await page.request.post(`/api/engagements/${engagementId}/samples`, {
    data: {
      populationId: population.id,
      name: "Receivables existence (accessibility)",
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
      await page.request.post(`/api/engagements/${engagementId}/samples/${sampleId}/draw`, { data: { seed: 4040 } })
    ).status(),
  ).toBe(201);
  const api = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const { items } = await (await page.request.get(`${api}/items?pageSize=200`)).json();
  const first = items[0] as { id: number; version: number; bookValue: string; itemRef: string };
  expect(
    (
      await page.request.patch(`${api}/items/${first.id}`, {
        data: { version: first.version, status: "done", auditedValue: first.bookValue },
      })
    ).status(),
  ).toBe(200);
  const sampleUrl = `/engagements/${engagementId}/samples/${sampleId}`;
  await page.goto(`${sampleUrl}/requests/new`);
  await expectNoViolations(page, "new request list");
  const form = new NewRequestListPage(page);
  await form.inviteContact(CONTACT.name, CONTACT.email);
  await form.send({
    title: "Accessibility scan — documents",
    itemRefs: [first.itemRef],
    needs: ["Remittance advice or proof of payment"],
    message: "Please send what you have.",
  });
  await expect(page.getByRole("heading", { name: "Accessibility scan — documents" })).toBeVisible();
  const teamListUrl = new URL(page.url()).pathname;

  // The auditor's screens, as the manager (who sees every action).
  await as(page, "manager");
  await scan(page, "/engagements", "engagements list");
  await scan(page, "/engagements/new", "new engagement");
  await scan(page, `/engagements/${engagementId}`, "engagement");
  await scan(page, `/engagements/${engagementId}/team`, "team");
  await scan(page, `/engagements/${engagementId}/populations/new`, "load a population");
  await scan(page, `/engagements/${engagementId}/populations/${population.id}`, "population");
  await scan(page, `/engagements/${engagementId}/samples/new`, "new sample");
  for (const tab of ["plan", "draw", "results"]) {
    await page.goto(`${sampleUrl}#${tab}`);
    await expect(page.getByRole("tab", { selected: true })).toBeVisible();
    await expectNoViolations(page, `sample, ${tab} tab`);
  }
  await scan(page, `${sampleUrl}/trail`, "audit trail");
  await scan(page, `${sampleUrl}/requests/new`, "new request list");
  await scan(page, teamListUrl, "request list (team view)");
  await scan(page, `/engagements/${engagementId}/misstatements`, "summary of misstatements");
  await scan(page, "/inbox", "reviewer's inbox");

  // The administrator's screens.
  await as(page, "admin");
  await scan(page, "/admin/users", "people");
  await scan(page, "/admin/users/new", "new person");

  // The client contact's screens: the invitation, the lists and one list.
  const invitation = await waitForMail(CONTACT.email, /invites you to share audit evidence/);
  const link = new URL(/(http\S+\/invitation\/[A-Za-z0-9_-]+)/.exec(invitation.text)![1]).pathname;
  await page.context().clearCookies();
  await scan(page, link, "invitation");
  await page.getByLabel("New password").fill(CONTACT.password);
  await page.getByLabel("Repeat the password").fill(CONTACT.password);
  await page.getByRole("button", { name: "Save my password" }).click();
  await expect(page.getByText("Your password is saved. Sign in with it now.")).toBeVisible();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(CONTACT.email);
  await page.getByLabel("Password").fill(CONTACT.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-as")).toHaveText(CONTACT.name);
  await scan(page, "/requests", "client's request lists");
  await page.getByRole("link", { name: "Accessibility scan — documents" }).click();
  await expect(page.getByRole("heading", { name: "Accessibility scan — documents" })).toBeVisible();
  await expectNoViolations(page, "client's request list");
});
