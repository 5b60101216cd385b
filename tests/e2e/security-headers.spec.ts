import { expect, test } from "@playwright/test";
import { createHash } from "node:crypto";
import { rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { encode } from "next-auth/jwt";
import { HttpSession } from "../bench/support/http-session";
import { DEMO, DEMO_PASSWORD, SignInPage } from "./pages/sign-in-page";
import { waitForMail } from "./pages/requests-pages";

const JSON_HEADERS = { "content-type": "application/json" };
const LEAK = /\bat \S+ \(|node_modules|\/work\/|\bSELECT\b|\bINSERT\b|ER_[A-Z_]+|Error:/;

function nextAuthSecret(): string {
  const saved = { ...process.env };
  process.loadEnvFile(".env.local");
  const secret = process.env.NEXTAUTH_SECRET!;
  Object.assign(process.env, saved);
  return secret;
}

test("pages carry a nonce CSP, frame-ancestors none, nosniff and a referrer policy, and still run with it", async ({
  page,
  request,
}) => {
  const violations: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to/.test(m.text())) violations.push(m.text());
  });
  const res = await request.get("/sign-in");
  const csp = res.headers()["content-security-policy"];
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(res.headers()["x-content-type-options"]).toBe("nosniff");
  expect(res.headers()["referrer-policy"]).toBe("strict-origin-when-cross-origin");
  expect(res.headers()["x-frame-options"]).toBe("DENY");
  const nonce = /'nonce-([^']+)'/.exec(csp)![1];
  expect(await res.text()).toContain(`nonce="${nonce}"`);
  const second = await request.get("/sign-in");
  expect(second.headers()["content-security-policy"], "a fresh nonce per request").not.toBe(csp);

  // The whole client app (hydration, sign-in form, navigation) works under the policy.
  await new SignInPage(page).signInAndWait("senior");
  await page.getByRole("link", { name: /Tessaly Outdoor Supply/ }).click();
  await expect(page.getByRole("heading", { name: "Financial statement audit FY2026" })).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("engagement-under-csp.png"), fullPage: true });
  expect(violations).toEqual([]);
});

test("API answers carry a no-content CSP and nosniff, and error bodies leak no stack or SQL", async ({ request }) => {
  const res = await request.get("/api/me");
  expect(res.status()).toBe(401);
  expect(res.headers()["content-security-policy"]).toContain("default-src 'none'");
  expect(res.headers()["x-content-type-options"]).toBe("nosniff");
  const s = new HttpSession(test.info().project.use.baseURL!);
  await s.signIn(DEMO.manager.email, DEMO_PASSWORD);
  const answers = await Promise.all([
    s.fetch("/api/engagements", { method: "POST", headers: JSON_HEADERS, body: '{"clientName": ' }),
    s.fetch("/api/engagements", {
      method: "POST",
      headers: JSON_HEADERS,
      body: JSON.stringify({ clientName: "x' OR 1=1 --", name: 5 }),
    }),
    s.fetch("/api/engagements/99999999999999999999"),
    s.fetch("/api/engagements/1%27%20OR%201=1/samples"),
    s.fetch("/api/engagements", { method: "POST", headers: JSON_HEADERS, body: "[".repeat(5000) + "]".repeat(5000) }),
    s.fetch("/api/engagements", {
      method: "POST",
      headers: JSON_HEADERS,
      body: JSON.stringify({ clientName: "x".repeat(400_000) }),
    }),
  ]);
  expect(answers.map((a) => a.status)).toEqual([400, 400, 404, 404, 400, 413]);
  for (const a of answers) expect(await a.text()).not.toMatch(LEAK);
  expect((await s.fetch("/api/me")).status, "the server is still up").toBe(200);
});

test("writes from another site are refused; same-site writes pass", async ({ baseURL }) => {
  const s = new HttpSession(baseURL!);
  await s.signIn(DEMO.manager.email, DEMO_PASSWORD);
  const body = JSON.stringify({
    clientName: "Cross-site",
    name: "Must not exist",
    periodEnd: "2026-12-31",
    currency: "USD",
    overallMateriality: "10",
    performanceMateriality: "5",
  });
  const evil = await s.fetch("/api/engagements", {
    method: "POST",
    headers: { ...JSON_HEADERS, origin: "https://evil.example" },
    body,
  });
  expect(evil.status).toBe(403);
  expect(await evil.json()).toMatchObject({ error: { code: "cross_site" } });
  const fetchSite = await s.fetch("/api/engagements", {
    method: "POST",
    headers: { ...JSON_HEADERS, "sec-fetch-site": "cross-site" },
    body,
  });
  expect(fetchSite.status).toBe(403);
  const own = await s.fetch("/api/engagements", {
    method: "POST",
    headers: { ...JSON_HEADERS, origin: baseURL! },
    body: "[]",
  });
  expect(own.status).toBe(400);
  const { engagements } = await s.json<{ engagements: { clientName: string }[] }>("/api/engagements");
  expect(engagements.map((e) => e.clientName)).not.toContain("Cross-site");
});

test("the session cookie is httpOnly and SameSite=Lax; an expired or forged session is refused", async ({
  baseURL,
}) => {
  const s = new HttpSession(baseURL!);
  const { csrfToken } = await s.json<{ csrfToken: string }>("/api/auth/csrf");
  const res = await s.fetch("/api/auth/callback/credentials", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken, email: DEMO.staff.email, password: DEMO_PASSWORD }).toString(),
  });
  const cookie = res.headers.getSetCookie().find((c) => c.startsWith("next-auth.session-token="));
  expect(cookie).toMatch(/HttpOnly/i);
  expect(cookie).toMatch(/SameSite=Lax/i);
  // Over plain http (loopback) next-auth cannot set Secure; over https it uses __Secure- cookies (useSecureCookies in lib/auth/options.ts).
  expect(cookie).not.toMatch(/Secure/i);
  expect((await s.fetch("/api/me")).status).toBe(200);

  const secret = nextAuthSecret();
  const staff = await s.json<{ user: { id: number } }>("/api/me");
  const ask = async (token: string) =>
    (await fetch(`${baseURL}/api/me`, { headers: { cookie: `next-auth.session-token=${token}` } })).status;
  const fresh = await encode({ token: { uid: staff.user.id, email: DEMO.staff.email }, secret, maxAge: 600 });
  expect(await ask(fresh), "a well-formed session (control)").toBe(200);
  const expired = await encode({ token: { uid: staff.user.id, email: DEMO.staff.email }, secret, maxAge: -120 });
  expect(await ask(expired), "a session past its expiry").toBe(401);
  const forged = await encode({ token: { uid: staff.user.id }, secret: "not-the-server-secret", maxAge: 600 });
  expect(await ask(forged), "a session signed with another secret").toBe(401);
});

/** The administrator adds a person; the person chooses a password with the e-mailed link (issue 19: no password typed by the admin). */
async function addPerson(admin: HttpSession, baseURL: string, name: string, email: string, password: string) {
  const created = await admin.json<{ user: { id: number } }>("/api/users", {
    method: "POST",
    headers: JSON_HEADERS,
    body: JSON.stringify({ name, email, grade: "staff" }),
  });
  await choosePassword(baseURL, email, /choose your Sondage password/, password);
  return created;
}

async function choosePassword(baseURL: string, email: string, subject: RegExp, password: string) {
  const token = /\/invitation\/([A-Za-z0-9_-]+)/.exec((await waitForMail(email, subject)).text)![1];
  const res = await fetch(`${baseURL}/api/invitations/${token}`, {
    method: "POST",
    headers: { ...JSON_HEADERS, origin: baseURL },
    body: JSON.stringify({ password }),
  });
  expect(res.status).toBe(200);
}

test("a deactivated user's open session stops working at the next request", async ({ baseURL }) => {
  const admin = new HttpSession(baseURL!);
  await admin.signIn(DEMO.admin.email, DEMO_PASSWORD);
  const email = `leaver-${Date.now()}@marrow-quill.example`;
  const created = await addPerson(admin, baseURL!, "Lee Vermont", email, "leaver-password-2026");
  const leaver = new HttpSession(baseURL!);
  await leaver.signIn(email, "leaver-password-2026");
  expect((await leaver.fetch("/api/me")).status).toBe(200);
  expect((await leaver.fetch("/engagements")).status).toBe(200);

  await admin.json(`/api/users/${created.user.id}`, {
    method: "PATCH",
    headers: JSON_HEADERS,
    body: JSON.stringify({ active: false }),
  });
  expect((await leaver.fetch("/api/me")).status).toBe(401);
  expect((await leaver.fetch("/api/engagements")).status).toBe(401);
  const page = await leaver.fetch("/engagements");
  expect(page.status).toBe(307);
  expect(page.headers.get("location")).toContain("/sign-in");
});

test("a password reset ends the person's open sessions; the password chosen with the e-mailed link signs in (issue 19)", async ({
  baseURL,
}) => {
  const admin = new HttpSession(baseURL!);
  await admin.signIn(DEMO.admin.email, DEMO_PASSWORD);
  const email = `reset-${Date.now()}@marrow-quill.example`;
  const created = await addPerson(admin, baseURL!, "Rhea Tamsin", email, "first-password-2026");
  const open = new HttpSession(baseURL!);
  await open.signIn(email, "first-password-2026");
  expect((await open.fetch("/api/me")).status).toBe(200);
  await new Promise((r) => setTimeout(r, 1100)); // the session's issue time is kept in whole seconds (JWT iat)

  const reset = await admin.fetch(`/api/users/${created.user.id}/password`, {
    method: "POST",
    headers: JSON_HEADERS,
    body: JSON.stringify({}),
  });
  expect(reset.status).toBe(200);
  expect((await open.fetch("/api/me")).status, "the session opened before the reset").toBe(401);
  expect((await open.fetch("/api/auth/session")).status).toBe(200);
  expect((await open.fetch("/api/me")).status, "and it does not come back when next-auth re-issues the cookie").toBe(
    401,
  );
  await choosePassword(baseURL!, email, /choose a new Sondage password/, "second-password-2026");
  const again = new HttpSession(baseURL!);
  await again.signIn(email, "second-password-2026");
  expect((await again.fetch("/api/me")).status).toBe(200);
});

test("a ledger upload larger than 10 MB arrives whole (no proxy buffers API bodies)", async ({ baseURL }) => {
  const senior = new HttpSession(baseURL!);
  await senior.signIn(DEMO.senior.email, DEMO_PASSWORD);
  const { engagements } = await senior.json<{ engagements: { id: number; clientName: string }[] }>("/api/engagements");
  const tessaly = engagements.find((e) => e.clientName.startsWith("Tessaly"))!;
  const lines = ["Invoice,Amount"];
  for (let i = 1; lines.length <= 700_000; i++) lines.push(`BIG-${String(i).padStart(8, "0")},${(i % 9973) + 0.25}`);
  const body = Buffer.from(lines.join("\n") + "\n");
  expect(body.length).toBeGreaterThan(12 * 1024 * 1024);
  const file = path.join(os.tmpdir(), `big-upload-${process.pid}.csv`);
  writeFileSync(file, body);
  try {
    const up = await senior.uploadFile<{ upload: { sizeBytes: number; sha256: string } }>(
      `/api/engagements/${tessaly.id}/populations/uploads?fileName=big.csv`,
      file,
    );
    expect(up.status).toBe(201);
    expect(up.body.upload.sizeBytes).toBe(body.length);
    expect(up.body.upload.sha256).toBe(createHash("sha256").update(body).digest("hex"));
  } finally {
    rmSync(file, { force: true });
  }
});
