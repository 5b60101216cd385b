import "server-only";
import fs from "node:fs";
import type { Readable } from "node:stream";
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
} from "@aws-sdk/client-s3";
import { getStorage } from "./s3-client";

let bucketReady: Promise<void> | null = null;

function ensureBucket(): Promise<void> {
  bucketReady ??= (async () => {
    const { client, bucket } = getStorage();
    try {
      await client.send(new HeadBucketCommand({ Bucket: bucket }));
    } catch {
      await client.send(new CreateBucketCommand({ Bucket: bucket }));
    }
  })().catch((err) => {
    bucketReady = null;
    throw err;
  });
  return bucketReady;
}

/** Stores a file from disk under `key`, streaming (never read whole into memory). */
export async function putObjectFromFile({
  key,
  path,
  contentType,
  size,
}: {
  key: string;
  path: string;
  contentType: string;
  size: number;
}) {
  await ensureBucket();
  const { client, bucket } = getStorage();
  const put = () =>
    client.send(
      new PutObjectCommand({
        Bucket: bucket,
        Key: key,
        Body: fs.createReadStream(path),
        ContentType: contentType,
        ContentLength: size,
      }),
    );
  try {
    await put();
  } catch (err) {
    // The SDK cannot replay a stream body, so a connection the store dropped is retried here, once,
    // from a fresh read of the file. Storing the same key twice is harmless.
    if (!isDroppedConnection(err)) throw err;
    await put();
  }
}

function isDroppedConnection(err: unknown): boolean {
  if (!(err instanceof Error)) return false;
  const code = (err as Error & { code?: string }).code;
  return code === "ECONNRESET" || code === "EPIPE" || /socket hang up/i.test(err.message);
}

export async function putObjectBytes({
  key,
  bytes,
  contentType,
}: {
  key: string;
  bytes: Uint8Array;
  contentType: string;
}) {
  await ensureBucket();
  const { client, bucket } = getStorage();
  await client.send(
    new PutObjectCommand({
      Bucket: bucket,
      Key: key,
      Body: bytes,
      ContentType: contentType,
      ContentLength: bytes.byteLength,
    }),
  );
}

/** The object's bytes as a Node stream with its length and type. */
export async function getObjectStream({
  key,
}: {
  key: string;
}): Promise<{ body: Readable; length?: number; contentType?: string }> {
  const { client, bucket } = getStorage();
  const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  return { body: out.Body as Readable, length: out.ContentLength, contentType: out.ContentType };
}

/** Removes the object under `key` (S3 answers success for a key that is not there). */
export async function deleteObject({ key }: { key: string }): Promise<void> {
  const { client, bucket } = getStorage();
  await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
}
