import { execFileSync } from "node:child_process";
import { existsSync, readdirSync, rmSync } from "node:fs";
import path from "node:path";
import { E2E_DB_NAME, E2E_INBOX_URL } from "./slot";

// Run from the project root (as npm and npx run Playwright). Recreates the e2e database with the demo data before the browser tests (the web server reads it per request),
// and empties the fake inbox: it keeps mail on disk between runs, and a spec must never follow an earlier run's link.
export default async function globalSetup() {
  const env = { ...process.env, DB_NAME: E2E_DB_NAME };
  execFileSync("npx", ["tsx", "db/migrate.ts", "recreate"], { env, stdio: "inherit" });
  execFileSync("npx", ["tsx", "db/seed.ts"], { env, stdio: "inherit" });
  // Only the message files: the folder stays, since a running fake writes each new message into it.
  const mail = path.join(process.cwd(), ".data", `fakes-${E2E_DB_NAME}`, "mail");
  for (const f of existsSync(mail) ? readdirSync(mail) : [])
    if (f.endsWith(".json")) rmSync(path.join(mail, f), { force: true });
  // The fakes (a webServer of playwright.config.ts) may already hold the old mail in memory.
  await fetch(E2E_INBOX_URL, { method: "DELETE" }).catch(() => undefined);
}
