import { expect, test, type Page } from "@playwright/test";
import { SignInPage } from "./pages/sign-in-page";
import { signInWith, waitForMail } from "./pages/requests-pages";

// Issue 19: firm staff choose their own password with an e-mailed link; a reset sends a new link and ends their sessions.
const shot = (page: Page, name: string) =>
  page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });
const linkIn = (text: string) => new URL(/(http\S+\/invitation\/[A-Za-z0-9_-]+)/.exec(text)![1]).pathname;

test("the administrator invites a person, who chooses a password with the e-mailed link; a reset sends a new one", async ({
  page,
}) => {
  const email = `noor-${Date.now()}@marrow-quill.example`;
  await new SignInPage(page).signInAndWait("admin");
  await expect(page).toHaveURL(/\/admin\/users$/);
  await page.getByRole("link", { name: "New user" }).click();
  await expect(page.getByLabel("First password")).toHaveCount(0);
  await page.getByLabel("Name").fill("Noor Achterberg");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Grade").selectOption("staff");
  for (const width of [1280, 1440, 1920]) {
    await page.setViewportSize({ width, height: 900 });
    await shot(page, `new-person-${width}`);
  }
  await page.getByRole("button", { name: "Invite by e-mail" }).click();
  await expect(
    page.getByRole("status").filter({ hasText: "Noor Achterberg was added and e-mailed a link" }),
  ).toBeVisible();
  await expect(page.getByRole("table", { name: "People" }).getByText(email)).toBeVisible();
  await shot(page, "people-after-invite");

  const invitation = await waitForMail(email, /choose your Sondage password/);
  await page.context().clearCookies();
  await page.goto(linkIn(invitation.text));
  await expect(page.getByRole("heading", { name: "Welcome, Noor Achterberg" })).toBeVisible();
  await expect(page.getByText("sign in to your firm’s Sondage workspace")).toBeVisible();
  await page.getByLabel("New password").fill("noor-chooses-2026");
  await page.getByLabel("Repeat the password").fill("noor-chooses-2026");
  await shot(page, "choose-password");
  await page.getByRole("button", { name: "Save my password" }).click();
  await expect(page.getByText("Your password is saved. Sign in with it now.")).toBeVisible();
  await signInWith(page, email, "noor-chooses-2026", "Noor Achterberg");

  // The administrator resets it: no password typed, the person gets a new link.
  await page.context().clearCookies();
  await new SignInPage(page).signInAndWait("admin");
  page.once("dialog", (d) => {
    expect(d.message()).toContain("open sessions end");
    void d.accept();
  });
  await page
    .getByRole("row", { name: new RegExp(email) })
    .getByRole("button", { name: "Reset password" })
    .click();
  await expect(
    page.getByRole("status").filter({ hasText: "They were e-mailed a link to choose a new one" }),
  ).toBeVisible();
  await shot(page, "people-after-reset");
  const reset = await waitForMail(email, /choose a new Sondage password/);
  expect(linkIn(reset.text)).not.toBe(linkIn(invitation.text));
});
