// A local S3-compatible fake on loopback (s3rver) for development and tests. Not used in production.
import fs from "node:fs";
import S3rver from "s3rver";

export async function startS3Fake({ port, directory }: { port: number; directory: string }) {
  fs.mkdirSync(directory, { recursive: true });
  const server = new S3rver({ port, address: "127.0.0.1", directory, silent: true });
  await server.run();
  return { close: () => server.close() };
}
