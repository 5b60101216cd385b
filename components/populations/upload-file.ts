import type { UploadInspection } from "@/lib/imports/inspect-upload";

export interface UploadView {
  id: number;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  inspection: UploadInspection;
}

export class UploadRefused extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

/**
 * Sends the file as the raw request body. XMLHttpRequest, not fetch, because only XHR reports
 * the bytes sent (upload.onprogress), which the progress bar shows.
 */
export function uploadLedgerFile(
  engagementId: number,
  file: File,
  onProgress: (sent: number, total: number) => void,
): Promise<UploadView> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/engagements/${engagementId}/populations/uploads?fileName=${encodeURIComponent(file.name)}`);
    xhr.setRequestHeader("content-type", "application/octet-stream");
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : file.size);
    xhr.onload = () => {
      const body = xhr.response as { upload?: UploadView; error?: { message?: string } } | null;
      if (xhr.status === 201 && body?.upload) resolve(body.upload);
      else reject(new UploadRefused(xhr.status, body?.error?.message ?? `The upload was refused (${xhr.status}).`));
    };
    xhr.onerror = () =>
      reject(new UploadRefused(0, "The connection dropped during the upload. Nothing was stored; try again."));
    xhr.send(file);
  });
}
