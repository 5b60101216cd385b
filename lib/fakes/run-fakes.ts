// Runs the local fakes of hosted services on loopback until stopped: object storage (s3rver).
import path from "node:path";
import { loadLocalEnv } from "../../db/load-env";
import { startS3Fake } from "./s3-fake";

async function main() {
  loadLocalEnv();
  const root = path.resolve(import.meta.dirname, "../..");
  const s3Port = Number(new URL(process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569").port);
  const s3 = await startS3Fake({ port: s3Port, directory: path.join(root, ".data", process.env.FAKES_DATA ?? "fakes", "s3") });
  console.log(`fakes: object storage on http://127.0.0.1:${s3Port}`);
  const stop = async () => {
    await s3.close();
    process.exit(0);
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

main().catch((err: unknown) => {
  console.error("fakes:", err instanceof Error ? err.message : err);
  process.exit(1);
});
