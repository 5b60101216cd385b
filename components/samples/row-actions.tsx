"use client";
import { useRef } from "react";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { Button } from "@/components/ui/button";
import { EVIDENCE_ACCEPT } from "./evidence-upload";

interface Props {
  item: SampleItemRecord;
  onReplace: (() => void) | null;
  onAttach: ((files: File[]) => void) | null;
}

/** A row's own actions beside Save: Replace… (not started or not auditable items) and Attach… evidence. */
export function RowActions({ item, onReplace, onAttach }: Props) {
  const input = useRef<HTMLInputElement>(null);
  if (item.status === "void") return null;
  const replaceable = onReplace && (item.status === "not-started" || item.status === "not-auditable");
  return (
    <>
      {replaceable && (
        <Button
          type="button"
          variant="ghost"
          className="px-2 py-1 text-xs"
          tabIndex={-1}
          data-row-action
          onClick={onReplace}
        >
          Replace…
        </Button>
      )}
      {onAttach && (
        <>
          <Button
            type="button"
            variant="ghost"
            className="px-2 py-1 text-xs"
            tabIndex={-1}
            data-row-action
            aria-label={`Attach evidence to ${item.itemRef}`}
            onClick={() => input.current?.click()}
          >
            Attach…
          </Button>
          <input
            ref={input}
            type="file"
            multiple
            accept={EVIDENCE_ACCEPT}
            className="hidden"
            tabIndex={-1}
            aria-hidden
            data-testid={`attach-${item.itemRef}`}
            onChange={(e) => {
              const files = Array.from(e.target.files ?? []);
              e.target.value = "";
              if (files.length) onAttach(files);
            }}
          />
        </>
      )}
    </>
  );
}
