import "server-only";
import { S3Client } from "@aws-sdk/client-s3";
import { z } from "zod";

const StorageEnv = z.object({
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().min(3),
  S3_ACCESS_KEY_ID: z.string().min(1),
  S3_SECRET_ACCESS_KEY: z.string().min(1),
});

const globalForS3 = globalThis as unknown as { sondageS3?: { client: S3Client; bucket: string } };

/** The object-storage client, built once from the environment (locally: the s3rver fake on loopback). */
export function getStorage(): { client: S3Client; bucket: string } {
  if (globalForS3.sondageS3) return globalForS3.sondageS3;
  const env = StorageEnv.parse(process.env);
  const client = new S3Client({
    endpoint: env.S3_ENDPOINT,
    forcePathStyle: Boolean(env.S3_ENDPOINT),
    region: env.S3_REGION,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    // s3rver stores aws-chunked bodies verbatim under the SDK's default checksums (STACK-NOTES):
    // only send checksums when an operation requires them.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  globalForS3.sondageS3 = { client, bucket: env.S3_BUCKET };
  return globalForS3.sondageS3;
}
