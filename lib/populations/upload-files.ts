import "server-only";
import { createHash, randomUUID } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { Readable, Transform } from "node:stream";
import { pipeline } from "node:stream/promises";
import { AppError } from "@/lib/errors";
import { MAX_UPLOAD_BYTES } from "@/lib/imports";
import { deleteObject, getObjectStream, putObjectFromFile } from "@/lib/storage/objects";

export function uploadDirectory(): string {
  return process.env.UPLOAD_DIR ?? path.join(process.cwd(), ".data", "uploads");
}

const megabytes = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;

export function tooLarge(maxBytes: number): AppError {
  return new AppError(
    413,
    "file_too_large",
    `The file is larger than the ${megabytes(maxBytes)} limit for a population file. Split the ledger or remove columns you do not need.`,
  );
}

/**
 * Streams a request body to a private temporary file, hashing it (SHA-256 of the bytes as received)
 * and stopping as soon as it passes the size limit. Never holds the file in memory.
 */
export async function receiveToTempFile(
  body: ReadableStream<Uint8Array> | null,
  declaredLength: number | null,
  maxBytes = MAX_UPLOAD_BYTES,
) {
  if (declaredLength !== null && declaredLength > maxBytes) throw tooLarge(maxBytes);
  if (!body) throw new AppError(400, "empty_file", "file: the upload was empty");
  const dir = uploadDirectory();
  await fs.promises.mkdir(dir, { recursive: true, mode: 0o700 });
  const tempPath = path.join(dir, `${randomUUID()}.upload`);
  const hash = createHash("sha256");
  let size = 0;
  const meter = new Transform({
    transform(chunk: Buffer, _enc, done) {
      size += chunk.length;
      if (size > maxBytes) return done(tooLarge(maxBytes));
      hash.update(chunk);
      done(null, chunk);
    },
  });
  try {
    await pipeline(
      Readable.fromWeb(body as import("node:stream/web").ReadableStream<Uint8Array>),
      meter,
      fs.createWriteStream(tempPath, { mode: 0o600 }),
    );
  } catch (err) {
    await fs.promises.rm(tempPath, { force: true });
    throw err;
  }
  return { tempPath, size, sha256: hash.digest("hex") };
}

export async function removeTempFile(tempPath: string) {
  await fs.promises.rm(tempPath, { force: true });
}

/** Where an upload's bytes are kept between the inspection and the load, so any app server can load it. */
export const uploadObjectKey = (engagementId: number, name: string) => `engagements/${engagementId}/uploads/${name}`;

/** Stores the received file in object storage (before the inspection answers). */
export async function storeUploadObject({ key, tempPath, size }: { key: string; tempPath: string; size: number }) {
  await putObjectFromFile({ key, path: tempPath, contentType: "application/octet-stream", size });
}

/** Removes an upload's stored bytes (an upload refused after they were stored). */
export async function removeUploadObject(key: string) {
  await deleteObject({ key });
}

/**
 * Streams an upload's bytes back from object storage to a private temporary file on this server
 * (the workbook reader needs random access), checking the SHA-256 against the one taken on
 * receipt. The caller removes the file when done.
 */
export async function fetchUploadToTempFile({
  objectKey,
  sha256,
}: {
  objectKey: string;
  sha256: string;
}): Promise<string> {
  const dir = uploadDirectory();
  await fs.promises.mkdir(dir, { recursive: true, mode: 0o700 });
  const tempPath = path.join(dir, `${randomUUID()}.fetched`);
  const hash = createHash("sha256");
  const meter = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      done(null, chunk);
    },
  });
  try {
    const { body } = await getObjectStream({ key: objectKey });
    await pipeline(body, meter, fs.createWriteStream(tempPath, { mode: 0o600 }));
  } catch (err) {
    await fs.promises.rm(tempPath, { force: true });
    throw err;
  }
  if (hash.digest("hex") !== sha256) {
    await fs.promises.rm(tempPath, { force: true });
    throw new AppError(
      500,
      "upload_corrupt",
      "The stored copy of this upload does not match the file received; upload it again.",
    );
  }
  return tempPath;
}
