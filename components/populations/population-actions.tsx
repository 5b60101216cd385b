"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";

interface Props {
  base: string;
  engagementUrl: string;
  name: string;
  usedBy: string[];
  replaced: boolean;
  archived: boolean;
}

/** Keeps a mistaken population out of the way: delete one nobody used, archive (or restore) one in use. */
export function PopulationActions({ base, engagementUrl, name, usedBy, replaced, archived }: Props) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const deletable = usedBy.length === 0 && !replaced;
  async function run(call: () => Promise<unknown>, then: () => void) {
    setError(null);
    try {
      await call();
      then();
    } catch (e) {
      setError((e as Error).message);
    }
  }
  return (
    <div className="space-y-2">
      {error && <Alert>{error}</Alert>}
      <div className="flex flex-wrap items-center gap-2">
        {deletable && (
          <Button
            variant="danger"
            className="px-2.5 py-1 text-xs"
            onClick={() => {
              if (
                window.confirm(
                  `Delete "${name}"? No sample uses it. Its items are removed; the file as received stays on record, and the deletion is kept in the audit trail.`,
                )
              ) {
                void run(
                  () => apiFetch(base, { method: "DELETE" }),
                  () => router.push(engagementUrl),
                );
              }
            }}
          >
            Delete population…
          </Button>
        )}
        <Button
          variant="secondary"
          className="px-2.5 py-1 text-xs"
          onClick={() =>
            void run(
              () => apiFetch(`${base}/archive`, { body: { archived: !archived } }),
              () => router.refresh(),
            )
          }
        >
          {archived ? "Restore from the archive" : "Archive"}
        </Button>
        {!deletable && (
          <span className="text-xs text-ink-soft">
            {usedBy.length
              ? `Used by ${usedBy.length === 1 ? "1 sample" : `${usedBy.length} samples`}, so it can be archived but not deleted.`
              : "Replaced by a corrected file, so it stays on record: it can be archived."}
          </span>
        )}
      </div>
    </div>
  );
}
