"use client";
import { useEffect, useRef } from "react";
import type { UploadView } from "./upload-file";
import { fileFactsView } from "./file-facts-view";

/** Brings its content into view once, when it first appears (the load button sits below the preview). */
export function InView({ children }: { children: React.ReactNode }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    ref.current?.scrollIntoView({ block: "center", behavior: "smooth" }); // newer browsers return a promise: not a cleanup
  }, []);
  return <div ref={ref}>{children}</div>;
}

export function FileFacts({ upload }: { upload: UploadView }) {
  const view = fileFactsView(upload);
  return (
    <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 rounded-md bg-paper-sunk/60 px-3 py-2 text-sm">
      <span className="font-medium text-ink">{view.fileName}</span>
      <span className="text-ink-soft">{view.facts.join(" · ")}</span>
      <span className="figures truncate text-xs text-ink-faint" title={view.sha256}>
        SHA-256 {view.sha256Short}
      </span>
    </div>
  );
}
