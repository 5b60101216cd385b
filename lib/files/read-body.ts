import "server-only";
import { AppError } from "@/lib/errors";

export const megabytes = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;

/**
 * The raw request body, refused with `tooLarge()` as soon as it passes `maxBytes`, whether the
 * client declared its length or not; null when the request has no body. Bounded, so it is held in memory.
 */
export async function readCappedBody(req: Request, maxBytes: number, tooLarge: () => AppError): Promise<Buffer | null> {
  const declared = req.headers.get("content-length");
  if (declared !== null && Number(declared) > maxBytes) throw tooLarge();
  if (!req.body) return null;
  const chunks: Uint8Array[] = [];
  let size = 0;
  const reader = req.body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks, size);
}

/** An uploaded file as bytes: 413 naming the limit when it is larger than `maxBytes`, 400 when empty. */
export async function readBodyBytes(
  req: Request,
  { maxBytes, what }: { maxBytes: number; what: string },
): Promise<Buffer> {
  const body = await readCappedBody(
    req,
    maxBytes,
    () => new AppError(413, "file_too_large", `The file is larger than the ${megabytes(maxBytes)} limit for ${what}.`),
  );
  if (!body || body.length === 0) throw new AppError(400, "empty_file", "file: the upload was empty");
  return body;
}
