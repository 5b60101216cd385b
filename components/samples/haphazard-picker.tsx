"use client";
import { useCallback, useMemo, useState } from "react";
import type { SampleItemRecord } from "@/lib/data/sample-items";
import type { PopulationItem } from "@/lib/data/population-items";
import { ItemsGrid, type GridPick } from "@/components/populations/items-grid";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { Table, THead, Th, Td } from "@/components/ui/table";
import { apiFetch } from "@/components/ui/api";
import { formatDateTime } from "@/lib/format/date";
import { useApi } from "@/components/ui/use-api";

interface Props {
  engagementId: number;
  sampleId: number;
  populationId: number;
  planned: number;
  mayPick: boolean;
  hasDescription: boolean;
  onChanged: () => void;
}

/**
 * Haphazard selection (ISA 530, Appendix 4(d)): the auditor picks items on the population's grid,
 * avoiding conscious bias; each pick is stored with who and when. No seed can re-perform it.
 */
export function HaphazardPicker({
  engagementId,
  sampleId,
  populationId,
  planned,
  mayPick,
  hasDescription,
  onChanged,
}: Props) {
  const base = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const read = useApi<{ items: SampleItemRecord[] }>(`${base}/items?pageSize=500`);
  const items = useMemo(() => read.data?.items ?? [], [read.data]);
  const [actionFailure, setFailure] = useState<string | null>(null);
  const failure = actionFailure ?? read.error?.message ?? null;
  const [busy, setBusy] = useState(false);
  const { mutate } = read;

  const picks = items.filter((i) => i.origin === "haphazard");
  const full = picks.length >= planned;
  const byRow = useMemo(
    () => new Map(items.map((i) => [i.populationRowNumber, i.keyItem ? ("key-item" as const) : ("picked" as const)])),
    [items],
  );
  const act = useCallback(
    async (fn: () => Promise<unknown>) => {
      setBusy(true);
      setFailure(null);
      try {
        await fn();
        await mutate();
        onChanged();
      } catch (e) {
        setFailure(e instanceof Error ? e.message : "Not saved");
      } finally {
        setBusy(false);
      }
    },
    [onChanged, mutate],
  );
  const pick: GridPick = useMemo(
    () => ({
      status: (row) => byRow.get(row) ?? null,
      disabled: busy || full || !mayPick,
      onPick: (item: PopulationItem) =>
        void act(() => apiFetch(`${base}/picks`, { body: { rowNumber: item.rowNumber } })),
    }),
    [byRow, busy, full, mayPick, act, base],
  );

  return (
    <div className="space-y-4" data-testid="haphazard-picker">
      <Alert tone="info">
        Pick the items yourself, across the whole population, without favouring items that are easy to reach, large,
        first or last on a page. Each pick is recorded with your name and the time; a haphazard selection cannot be
        re-performed from a seed, so the workpaper lists every pick.
      </Alert>
      <p className="text-sm" aria-live="polite" data-testid="picks-count">
        <span className="figures font-semibold">{picks.length}</span> of <span className="figures">{planned}</span>{" "}
        items picked{full ? " — the planned size is reached." : "."}
      </p>
      {failure && <Alert>{failure}</Alert>}
      {picks.length > 0 && (
        <Table label="Haphazard picks">
          <THead>
            <tr>
              <Th className="py-1">Item</Th>
              <Th numeric className="py-1">
                Row
              </Th>
              <Th numeric className="py-1">
                Book value
              </Th>
              <Th className="py-1 pl-4">Picked by</Th>
              <Th className="py-1">When</Th>
              <Th className="py-1">
                <span className="sr-only">Action</span>
              </Th>
            </tr>
          </THead>
          <tbody>
            {picks.map((p) => (
              <tr key={p.id} className="border-t border-ink-line/60">
                <Td className="py-1.5 font-medium">{p.itemRef}</Td>
                <Td numeric className="py-1.5">
                  {p.populationRowNumber}
                </Td>
                <Td numeric className="py-1.5">
                  <Amount value={p.bookValue} />
                </Td>
                <Td className="py-1.5 pl-4">{p.pickedByName}</Td>
                <Td className="figures py-1.5">{formatDateTime(p.pickedAt)}</Td>
                <Td className="py-1.5 text-right">
                  {mayPick && p.status === "not-started" && (
                    <Button
                      type="button"
                      variant="secondary"
                      disabled={busy}
                      onClick={() => void act(() => apiFetch(`${base}/picks/${p.id}`, { method: "DELETE" }))}
                      aria-label={`Remove the pick ${p.itemRef}`}
                    >
                      Remove
                    </Button>
                  )}
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
      <ItemsGrid
        url={`/api/engagements/${engagementId}/populations/${populationId}/items`}
        extraColumns={[]}
        hasDescription={hasDescription}
        hasDate={false}
        pick={pick}
      />
    </div>
  );
}
