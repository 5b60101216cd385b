"use client";
import { useState } from "react";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { apiFetch } from "@/components/ui/api";
import { formatDate } from "@/lib/format/date";
import { useApi } from "@/components/ui/use-api";
import { Textarea } from "@/components/ui/field";

interface Props {
  base: string;
  method: string;
  refreshKey: number;
  mayMark: boolean;
  mayAccept: boolean;
  allowed: boolean;
  onChanged: () => void;
}

/**
 * Misstatements that may be anomalous (ISA 530 ¶13, AU-C 530.13): a preparer proposes one with a written
 * justification of the extremely rare circumstances; it counts only once a manager or partner accepts it.
 */
export function AnomalyPanel({ base, method, refreshKey, mayMark, mayAccept, allowed, onChanged }: Props) {
  const read = useApi<{ items: SampleItemRecord[] }>(`${base}/items?pageSize=500`, { revision: refreshKey });
  const items = read.data?.items ?? [];
  const [open, setOpen] = useState<number | null>(null);
  const [text, setText] = useState("");
  const [actionFailure, setFailure] = useState<string | null>(null);
  const failure = actionFailure ?? read.error?.message ?? null;
  const act = async (fn: () => Promise<unknown>) => {
    setFailure(null);
    try {
      await fn();
      setOpen(null);
      setText("");
      await read.mutate();
      onChanged();
    } catch (e) {
      setFailure(e instanceof Error ? e.message : "Not saved");
    }
  };
  const candidates = items.filter(
    (i) => !i.keyItem && i.status !== "void" && i.misstatement !== null && i.misstatement !== "0.00",
  );
  return (
    <div className="space-y-3 text-sm" data-testid="anomaly-panel">
      {method === "mus" && (
        <Alert tone="info">
          A monetary-unit evaluation ignores anomaly marks: the Stringer bound has no provision for them.
        </Alert>
      )}
      {!allowed && (
        <Alert tone="info">
          The firm&rsquo;s methodology for this plan does not allow anomalous misstatements (for example on PCAOB
          engagements: AS 2315 has no anomaly provision).
        </Alert>
      )}
      {failure && <Alert>{failure}</Alert>}
      {candidates.length === 0 ? (
        <p className="text-ink-soft">No misstatement outside the key items yet.</p>
      ) : (
        <ul className="divide-y divide-ink-line/60">
          {candidates.map((i) => (
            <li key={i.id} className="py-2">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <span>
                  <span className="font-medium">{i.itemRef}</span> · misstatement <Amount value={i.misstatement!} />
                </span>
                <span className="flex gap-2">
                  {!i.anomaly && mayMark && allowed && (
                    <Button
                      type="button"
                      variant="secondary"
                      onClick={() => {
                        setOpen(i.id);
                        setText("");
                      }}
                    >
                      Propose as anomalous
                    </Button>
                  )}
                  {i.anomaly && !i.anomaly.acceptedAt && mayAccept && allowed && (
                    <Button
                      type="button"
                      onClick={() =>
                        void act(() =>
                          apiFetch(`${base}/items/${i.id}/anomaly/acceptance`, { body: { confirm: true } }),
                        )
                      }
                    >
                      Accept the anomaly
                    </Button>
                  )}
                  {i.anomaly && mayMark && (
                    <Button
                      type="button"
                      variant="secondary"
                      onClick={() => void act(() => apiFetch(`${base}/items/${i.id}/anomaly`, { method: "DELETE" }))}
                    >
                      Withdraw
                    </Button>
                  )}
                </span>
              </div>
              {i.anomaly && (
                <p className="mt-1 text-ink-soft">
                  “{i.anomaly.justification}” — proposed by {i.anomaly.markedByName}
                  {i.anomaly.acceptedAt
                    ? `, accepted by ${i.anomaly.acceptedByName} on ${formatDate(i.anomaly.acceptedAt)}: excluded from the projection and added at its actual amount`
                    : ", awaiting a manager's or partner's acceptance"}
                  .
                </p>
              )}
              {open === i.id && (
                <form
                  className="mt-2 space-y-2"
                  onSubmit={(e) => {
                    e.preventDefault();
                    void act(() => apiFetch(`${base}/items/${i.id}/anomaly`, { body: { justification: text } }));
                  }}
                >
                  <label className="block font-medium" htmlFor={`anomaly-${i.id}`}>
                    Why is this misstatement not representative of the population? (extremely rare circumstances)
                  </label>
                  <Textarea id={`anomaly-${i.id}`} rows={3} value={text} onChange={(e) => setText(e.target.value)} />
                  <div className="flex gap-2">
                    <Button type="submit">Propose</Button>
                    <Button type="button" variant="secondary" onClick={() => setOpen(null)}>
                      Cancel
                    </Button>
                  </div>
                </form>
              )}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
