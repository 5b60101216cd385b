import { defineConfig } from "@playwright/test";

const PORT = Number(process.env.E2E_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${PORT}`;

// The e2e server's own fakes of hosted services, on ports apart from `npm start`'s.
const E2E_SERVICES = {
  S3_ENDPOINT: "http://127.0.0.1:4589",
  S3_BUCKET: "sondage-e2e",
  SMTP_PORT: "2545",
  MAIL_INBOX_PORT: "2595",
  UPLOAD_DIR: ".data/uploads-e2e",
};

export default defineConfig({
  testDir: "tests/e2e",
  outputDir: "test-results/e2e",
  fullyParallel: false,
  workers: 1,
  forbidOnly: !!process.env.CI,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [["list"], ["html", { open: "never", outputFolder: "playwright-report" }]],
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
  },
  webServer: [
    {
      command: "npx tsx lib/fakes/run-fakes.ts",
      url: `${E2E_SERVICES.S3_ENDPOINT}/`,
      reuseExistingServer: false,
      timeout: 30_000,
      env: { ...E2E_SERVICES, FAKES_DATA: "fakes-e2e" },
    },
    {
      command: `node node_modules/next/dist/bin/next start -H 127.0.0.1 -p ${PORT}`,
      url: `${baseURL}/sign-in`,
      reuseExistingServer: false,
      timeout: 60_000,
      env: { ...E2E_SERVICES, DB_NAME: "sondage_e2e", NEXTAUTH_URL: baseURL, NEXT_TELEMETRY_DISABLED: "1" },
    },
  ],
});
