import path from "node:path";

// INTEGRATION_SLOT lets several integration runs share the machine (each with its own database,
// storage fake port and upload folder); CI and `npm test` use slot 0.
const slot = Number(process.env.INTEGRATION_SLOT ?? 0);
const suffix = slot === 0 ? "" : String(slot);

/** Where integration tests point the app's services: their own database, storage fake and upload folder. */
export const TEST_ENV = {
  DB_NAME: `sondage_test${suffix}`,
  S3_ENDPOINT: `http://127.0.0.1:${4579 + slot * 10}`,
  S3_BUCKET: "sondage-integration",
  S3_ACCESS_KEY_ID: "S3RVER",
  S3_SECRET_ACCESS_KEY: "S3RVER",
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(2535 + slot * 10),
  MAIL_INBOX_PORT: String(2536 + slot * 10),
  UPLOAD_DIR: path.join(import.meta.dirname, `../../.data/uploads-integration${suffix}`),
};

/**
 * Harness time limits are multiplied by INTEGRATION_TIMEOUT_SCALE (default 1): `npm run test:cluster`
 * sets 3, as a 1,000,000-row load through a Galera cluster on a shared 2-core machine runs past
 * 2 minutes. A limit for the harness, not a speed check (speed is measured in the benchmarks).
 */
export const timeoutScale = Math.max(1, Number(process.env.INTEGRATION_TIMEOUT_SCALE ?? 1) || 1);
