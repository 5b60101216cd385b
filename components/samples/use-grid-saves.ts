"use client";
import { useCallback, useState } from "react";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { apiFetch } from "@/components/ui/api";
import { rowValuesOf, saveBodyOf, type SaveBody } from "./result-values";
import { readPastedColumn } from "./paste-column";
import type { UndoOffer } from "./undo-bar";
import { countOf, formatCount } from "@/lib/format/number";

export type Notice = { tone: "error" | "success"; text: string } | null;
type BatchRow = SaveBody & { itemId: number };

interface Options {
  resultsUrl: string;
  attribute: boolean;
  apply: (items: SampleItemRecord[]) => void;
}

const current = (it: SampleItemRecord, attribute: boolean): BatchRow => ({
  itemId: it.id,
  ...saveBodyOf(rowValuesOf(it), it.version, attribute),
});

/**
 * The grid's saves of several rows (POST …/results: all or nothing, an audit row each) and the
 * undo of the last save, offered for a few seconds and itself saved as a new, audited change.
 */
export function useGridSaves({ resultsUrl, attribute, apply }: Options) {
  const [notice, setNotice] = useState<Notice>(null);
  const [undo, setUndo] = useState<UndoOffer | null>(null);
  const clearUndo = useCallback(() => setUndo(null), []);

  const offerUndo = useCallback(
    (text: string, before: SampleItemRecord[], after: SampleItemRecord[]) => {
      const versions = new Map(after.map((a) => [a.id, a.version]));
      setUndo({
        id: Date.now(),
        text,
        undo: async () => {
          const rows = before.map((b) => ({ ...current(b, attribute), version: versions.get(b.id) ?? b.version }));
          try {
            const r = await apiFetch<{ items: SampleItemRecord[] }>(resultsUrl, { body: { rows } });
            apply(r.items);
            setUndo(null);
            setNotice({
              tone: "success",
              text: `Undone: ${before.length === 1 ? before[0].itemRef : countOf(before.length, "item")} back as before (recorded in the audit trail).`,
            });
          } catch (e) {
            setUndo(null);
            setNotice({ tone: "error", text: `The undo was not saved: ${(e as Error).message}` });
          }
        },
      });
    },
    [apply, attribute, resultsUrl],
  );

  const saveRows = useCallback(
    async (rows: BatchRow[], before: SampleItemRecord[], done: string) => {
      setNotice(null);
      try {
        const r = await apiFetch<{ items: SampleItemRecord[] }>(resultsUrl, { body: { rows } });
        apply(r.items);
        offerUndo(done, before, r.items);
      } catch (e) {
        setNotice({ tone: "error", text: (e as Error).message });
      }
    },
    [apply, offerUndo, resultsUrl],
  );

  /** A column pasted into the audited value of `start`: fills it and the rows below on this page. */
  const pasteColumn = useCallback(
    (text: string, start: SampleItemRecord, rows: SampleItemRecord[]): boolean => {
      const values = readPastedColumn(text);
      if (!values) return false;
      const below = rows.filter((r) => r.status !== "void");
      const targets = below.slice(below.findIndex((r) => r.id === start.id));
      if (values.length > targets.length) {
        setNotice({
          tone: "error",
          text: `${countOf(values.length, "value")} pasted, but only ${countOf(targets.length, "row")} from ${start.itemRef} down on this page. Show more rows per page, or paste fewer values. Nothing was saved.`,
        });
        return true;
      }
      const chosen = targets.slice(0, values.length);
      const batch = chosen.map((it, i) => ({
        ...current(it, attribute),
        status: "done" as const,
        auditedValue: values[i],
      }));
      void saveRows(
        batch,
        chosen,
        `Pasted ${formatCount(values.length)} audited values into ${chosen[0].itemRef} to ${chosen.at(-1)!.itemRef}.`,
      );
      return true;
    },
    [attribute, saveRows],
  );

  /** "Agreed to book": the audited value is the book value (attribute samples: no deviation). */
  const agreeToBook = useCallback(
    async (items: SampleItemRecord[]) => {
      const live = items.filter((i) => i.status !== "void");
      const batch = live.map((it) =>
        attribute
          ? { ...current(it, attribute), status: "done" as const, deviation: false, deviationNature: null }
          : {
              ...current(it, attribute),
              status: "done" as const,
              auditedValue: it.bookValue,
              cause: null,
              causeNote: null,
            },
      );
      await saveRows(batch, live, `Marked ${countOf(live.length, "item")} as agreed to book.`);
    },
    [attribute, saveRows],
  );

  const savedOne = useCallback(
    (after: SampleItemRecord, before: SampleItemRecord) => {
      setNotice(null);
      offerUndo(`Saved ${after.itemRef}.`, [before], [after]);
    },
    [offerUndo],
  );

  return { notice, setNotice, undo, clearUndo, pasteColumn, agreeToBook, savedOne };
}
