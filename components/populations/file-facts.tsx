"use client";
import { useEffect, useRef } from "react";
import type { UploadView } from "./upload-file";
import { formatBytes, formatCount } from "@/lib/format/number";

/** Brings its content into view once, when it first appears (the load button sits below the preview). */
export function InView({ children }: { children: React.ReactNode }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    ref.current?.scrollIntoView({ block: "center", behavior: "smooth" }); // newer browsers return a promise: not a cleanup
  }, []);
  return <div ref={ref}>{children}</div>;
}

const ENCODING_LABELS = { "utf-8": "UTF-8", "utf-8-bom": "UTF-8 with BOM", "windows-1252": "Windows-1252" } as const;

const DELIMITER_NAMES = { ",": "comma", ";": "semicolon", "\t": "tab", "|": "pipe" } as const;

export function FileFacts({ upload }: { upload: UploadView }) {
  const i = upload.inspection;
  const facts = [
    i.kind === "xlsx"
      ? "Excel workbook"
      : `CSV, ${ENCODING_LABELS[i.encoding ?? "utf-8"]}, ${DELIMITER_NAMES[i.delimiter ?? ","]}-separated`,
    formatBytes(upload.sizeBytes),
    `${formatCount(i.headers.length)} columns`,
  ];
  return (
    <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 rounded-md bg-paper-sunk/60 px-3 py-2 text-sm">
      <span className="font-medium text-ink">{upload.fileName}</span>
      <span className="text-ink-soft">{facts.join(" · ")}</span>
      <span className="figures truncate text-xs text-ink-faint" title={upload.sha256}>
        SHA-256 {upload.sha256.slice(0, 16)}…
      </span>
    </div>
  );
}
