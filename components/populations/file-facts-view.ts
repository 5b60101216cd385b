import type { UploadView } from "./upload-file";
import { countOf, formatBytes, formatCount } from "@/lib/format/number";

const ENCODING_LABELS = { "utf-8": "UTF-8", "utf-8-bom": "UTF-8 with BOM", "windows-1252": "Windows-1252" } as const;
const DELIMITER_NAMES = { ",": "comma", ";": "semicolon", "\t": "tab", "|": "pipe" } as const;

export interface FileFactsView {
  fileName: string;
  /** "CSV, UTF-8, comma-separated" · "38 MB" · "1,000,000 data rows" · "5 columns" */
  facts: string[];
  sha256: string;
  sha256Short: string;
}

/**
 * The facts the inspection step shows about an upload: its kind, size, the data rows counted at
 * upload (the whole file, so the auditor can compare it with the ledger's own count before loading)
 * and its columns. Uploads received before rows were counted carry no count, and show none.
 */
export function fileFactsView(upload: UploadView): FileFactsView {
  const i = upload.inspection;
  const facts = [
    i.kind === "xlsx"
      ? "Excel workbook"
      : `CSV, ${ENCODING_LABELS[i.encoding ?? "utf-8"]}, ${DELIMITER_NAMES[i.delimiter ?? ","]}-separated`,
    formatBytes(upload.sizeBytes),
    ...(i.dataRows === undefined ? [] : [countOf(i.dataRows, "data row")]),
    `${formatCount(i.headers.length)} columns`,
  ];
  return { fileName: upload.fileName, facts, sha256: upload.sha256, sha256Short: `${upload.sha256.slice(0, 16)}…` };
}
