"use client";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch } from "@/components/ui/api";
import type { ReperformResult } from "./types";
import { formatDateTime } from "@/lib/format/date";

/** Recomputes the current draw from its stored seed and inputs and compares it item by item with what is stored. */
export function ReperformPanel({
  engagementId,
  sampleId,
  onChecked,
}: {
  engagementId: number;
  sampleId: number;
  onChecked: () => void;
}) {
  const [result, setResult] = useState<ReperformResult | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const run = async () => {
    setBusy(true);
    setFailure(null);
    try {
      setResult(
        (
          await apiFetch<{ reperform: ReperformResult }>(
            `/api/engagements/${engagementId}/samples/${sampleId}/reperform`,
            { body: {} },
          )
        ).reperform,
      );
      onChecked();
    } catch (err) {
      setFailure(err instanceof Error ? err.message : "The re-performance failed");
    } finally {
      setBusy(false);
    }
  };
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <Button type="button" variant="secondary" onClick={run} disabled={busy}>
          {busy ? "Recomputing…" : "Re-perform the selection"}
        </Button>
        <a
          href={`/api/engagements/${engagementId}/samples/${sampleId}/recipe`}
          download
          className="text-sm font-medium text-ledger-600 link"
        >
          Download the reproduction recipe (.txt)
        </a>
      </div>
      {failure && <Alert>{failure}</Alert>}
      {result && (
        <div data-testid="reperform-result">
          <Alert tone={result.matches ? "success" : "error"}>
            <p className="font-semibold">
              {result.matches
                ? "The recomputed selection matches the stored one, item by item."
                : "The recomputed selection differs from the stored one."}
            </p>
            <p className="mt-1">
              <span className="figures">{result.storedItems}</span> items stored,{" "}
              <span className="figures">{result.recomputedItems}</span> recomputed · checked{" "}
              {formatDateTime(result.checkedAt)}
            </p>
            <p className="mt-1 break-all text-xs">
              Recomputed selection SHA-256 <code className="figures">{result.recomputedSha256}</code>
            </p>
          </Alert>
          {result.differences.length > 0 && (
            <ul className="mt-2 list-disc pl-5 text-sm text-brick-700">
              {result.differences.map((d) => (
                <li key={d}>{d}</li>
              ))}
            </ul>
          )}
        </div>
      )}
    </div>
  );
}
