import { expect, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "sondage-demo-2026";

export const DEMO = {
  admin: { email: "admin@marrow-quill.example", name: "Sam Whitaker" },
  partner: { email: "partner@marrow-quill.example", name: "Helena Brandt" },
  manager: { email: "manager@marrow-quill.example", name: "Tomás Reyes" },
  senior: { email: "senior@marrow-quill.example", name: "Priya Nair" },
  senior2: { email: "senior2@marrow-quill.example", name: "Owen Park" },
  staff: { email: "staff@marrow-quill.example", name: "Jonah Lindqvist" },
  client: { email: "carla.mendes@tessaly-outdoor.example", name: "Carla Mendes" },
} as const;

export type DemoRole = keyof typeof DEMO;

export class SignInPage {
  constructor(private readonly page: Page) {}

  async signIn(role: DemoRole, password = DEMO_PASSWORD) {
    await this.page.goto("/sign-in");
    await this.page.getByLabel("E-mail").fill(DEMO[role].email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByRole("button", { name: "Sign in" }).click();
  }

  async signInAndWait(role: DemoRole) {
    await this.signIn(role);
    await expect(this.page.getByTestId("signed-in-as")).toHaveText(DEMO[role].name);
  }

  async signOut() {
    await this.page.getByRole("button", { name: "Sign out" }).click();
    await expect(this.page.getByRole("button", { name: "Sign in" })).toBeVisible();
  }
}
