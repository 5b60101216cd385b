import "server-only";
import { Readable } from "node:stream";
import { getObjectStream } from "@/lib/storage/objects";

/** A stored file exactly as uploaded, always as an attachment that the browser must not sniff. */
export async function storedFileResponse(f: {
  objectKey: string;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
}): Promise<Response> {
  const object = await getObjectStream({ key: f.objectKey });
  const asciiName = f.fileName.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return new Response(Readable.toWeb(object.body) as ReadableStream, {
    headers: {
      "content-type": f.contentType,
      "content-length": String(f.sizeBytes),
      "content-disposition": `attachment; filename="${asciiName}"; filename*=UTF-8''${encodeURIComponent(f.fileName)}`,
      "x-content-type-options": "nosniff",
      "content-security-policy": "sandbox",
      "x-content-sha256": f.sha256,
      "cache-control": "private, no-store",
    },
  });
}
