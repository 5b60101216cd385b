// A local S3-compatible fake on loopback (s3rver) for development and tests. Not used in production.
import fs from "node:fs";
import S3rver from "s3rver";

export async function startS3Fake({ port, directory }: { port: number; directory: string }) {
  fs.mkdirSync(directory, { recursive: true });
  const server = new S3rver({ port, address: "127.0.0.1", directory, silent: true });
  await server.run();
  // Node closes an idle keep-alive socket after 5 s; a client that reuses it at that instant gets
  // "socket hang up" mid-upload. Real object stores keep idle connections far longer, so the fake does too.
  const httpServer = (server as unknown as { httpServer?: { keepAliveTimeout: number } }).httpServer;
  if (httpServer) httpServer.keepAliveTimeout = 120_000;
  return { close: () => server.close() };
}
