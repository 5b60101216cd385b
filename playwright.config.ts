import { defineConfig } from "@playwright/test";
import { E2E_DB_NAME, E2E_PORT, E2E_SERVICES, E2E_SLOT } from "./tests/e2e/slot";

const baseURL = `http://127.0.0.1:${E2E_PORT}`;

export default defineConfig({
  testDir: "tests/e2e",
  globalSetup: "./tests/e2e/global-setup.ts",
  outputDir: E2E_SLOT === 0 ? "test-results/e2e" : `test-results/e2e${E2E_SLOT}`,
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
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
  },
  webServer: [
    {
      command: "npx tsx lib/fakes/run-fakes.ts",
      url: `${E2E_SERVICES.S3_ENDPOINT}/`,
      reuseExistingServer: false,
      timeout: 30_000,
      env: { ...E2E_SERVICES, FAKES_DATA: `fakes-${E2E_DB_NAME}` },
    },
    // E2E_CLUSTER=1: two app servers behind HAProxy on this port instead of one (tests/cluster/app-cluster.ts).
    process.env.E2E_CLUSTER === "1"
      ? {
          command: `npx tsx tests/cluster/app-cluster.ts --front ${E2E_PORT}`,
          url: `${baseURL}/api/health`,
          reuseExistingServer: false,
          timeout: 120_000,
          env: { ...E2E_SERVICES, DB_NAME: E2E_DB_NAME, NEXT_TELEMETRY_DISABLED: "1" },
        }
      : {
          command: `node node_modules/next/dist/bin/next start -H 127.0.0.1 -p ${E2E_PORT}`,
          url: `${baseURL}/sign-in`,
          reuseExistingServer: false,
          timeout: 60_000,
          env: { ...E2E_SERVICES, DB_NAME: E2E_DB_NAME, NEXTAUTH_URL: baseURL, NEXT_TELEMETRY_DISABLED: "1" },
        },
  ],
});
