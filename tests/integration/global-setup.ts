import fs from "node:fs";
import path from "node:path";
import knex from "knex";
import { loadLocalEnv } from "@/db/load-env";
import { buildKnexConfig } from "@/db/knex-config";
import { recreateDatabase } from "@/db/recreate-database";
import { startS3Fake } from "@/lib/fakes/s3-fake";
import { startSmtpFake } from "@/lib/fakes/smtp-fake";
import { TEST_ENV } from "./test-env";

/**
 * Integration tests get their own database on the private server, recreated and migrated per run,
 * and their own object-storage and SMTP fakes on loopback (emptied per run; the mail inbox lives in memory).
 */
export default async function setup() {
  loadLocalEnv();
  Object.assign(process.env, TEST_ENV);
  await recreateDatabase(TEST_ENV.DB_NAME);
  const db = knex(buildKnexConfig());
  try {
    await db.migrate.latest();
  } finally {
    await db.destroy();
  }
  const s3Dir = path.join(import.meta.dirname, `../../.data/s3-${TEST_ENV.DB_NAME}`);
  fs.rmSync(s3Dir, { recursive: true, force: true });
  const s3 = await startS3Fake({ port: Number(new URL(TEST_ENV.S3_ENDPOINT).port), directory: s3Dir });
  const mail = await startSmtpFake({
    smtpPort: Number(TEST_ENV.SMTP_PORT),
    inboxPort: Number(TEST_ENV.MAIL_INBOX_PORT),
  });
  return async () => {
    await Promise.all([s3.close(), mail.close()]);
  };
}
