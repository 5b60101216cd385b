// Runs the local fakes of hosted services on loopback until stopped: object storage (s3rver) and an
// SMTP catcher with a JSON/HTML inbox.
import path from "node:path";
import { loadLocalEnv } from "../../db/load-env";
import { startS3Fake } from "./s3-fake";
import { startSmtpFake } from "./smtp-fake";

async function main() {
  loadLocalEnv();
  const root = path.resolve(import.meta.dirname, "../..");
  const data = path.join(root, ".data", process.env.FAKES_DATA ?? "fakes");
  const s3Port = Number(new URL(process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569").port);
  const s3 = await startS3Fake({ port: s3Port, directory: path.join(data, "s3") });
  console.log(`fakes: object storage on http://127.0.0.1:${s3Port}`);
  const mail = await startSmtpFake({
    smtpPort: Number(process.env.SMTP_PORT ?? 2525),
    inboxPort: Number(process.env.MAIL_INBOX_PORT ?? 2580),
    directory: path.join(data, "mail"),
  });
  console.log(`fakes: SMTP on 127.0.0.1:${mail.smtpPort}; inbox at ${mail.inboxUrl}`);
  const stop = async () => {
    await Promise.all([s3.close(), mail.close()]);
    process.exit(0);
  };
  process.on("SIGTERM", () => void stop());
  process.on("SIGINT", () => void stop());
}

main().catch((err: unknown) => {
  console.error("fakes:", err instanceof Error ? err.message : err);
  process.exit(1);
});
