import { execFileSync } from "node:child_process";

// Recreates the e2e database with the demo data before the browser tests (the web server reads it per request).
export default function globalSetup() {
  const slot = Number(process.env.E2E_SLOT ?? 0);
  const env = { ...process.env, DB_NAME: slot === 0 ? "sondage_e2e" : `sondage_e2e${slot}` };
  execFileSync("npx", ["tsx", "db/migrate.ts", "recreate"], { env, stdio: "inherit" });
  execFileSync("npx", ["tsx", "db/seed.ts"], { env, stdio: "inherit" });
}
