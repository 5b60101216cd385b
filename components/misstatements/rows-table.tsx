"use client";
import { useState } from "react";
import Link from "next/link";
import type { SummaryRow, SummaryView } from "@/lib/misstatements/types";
import { KIND_LABELS, treatmentOf } from "@/lib/misstatements/labels";
import { Amount } from "@/components/ui/amount";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CorrectionForm } from "./correction-form";
import { EntryEvidence } from "./entry-evidence";
import { EntryForm, type EntryDefaults } from "./entry-form";
import { useSummaryAction } from "./use-summary-action";
import { Table, THead, Th, Td } from "@/components/ui/table";

const GROUPS: { title: string; test: (r: SummaryRow) => boolean }[] = [
  { title: "Uncorrected — accumulated", test: (r) => r.accumulated },
  { title: "Clearly trivial — listed, not accumulated", test: (r) => r.clearlyTrivial },
  { title: "Corrected by the client", test: (r) => r.corrected !== null },
  {
    title: "Prior period, carried forward — current-year effect under each approach",
    test: (r) => r.kind === "prior-period" && r.corrected === null,
  },
];

const money = (v: string | null) => (v === null ? <span className="text-ink-faint">—</span> : <Amount value={v} />);

/** The schedule, grouped, each figure linked to its source; corrections and the team's entries are changed here. */
export function RowsTable({ view, mayEdit }: { view: SummaryView; mayEdit: boolean }) {
  const { act, busy, message } = useSummaryAction(view.engagement.id);
  const [correcting, setCorrecting] = useState<string | null>(null);
  const [editing, setEditing] = useState<EntryDefaults | null>(null);
  const edit = (r: SummaryRow) => {
    const e = view.entries.find((x) => x.id === r.entryId)!;
    setEditing({
      id: e.id,
      version: e.version,
      values: {
        kind: r.kind as "factual",
        account: r.account,
        assertion: r.assertion,
        description: r.description,
        amount: r.amount,
        incomeEffect: r.incomeEffect ?? "0",
        balanceEffect: r.balanceEffect ?? "0",
        corrected: r.corrected,
      },
    });
  };
  const correct = (r: SummaryRow, corrected: { on: string; reference: string } | null) =>
    void act(
      "/corrections",
      { body: { sampleId: r.sampleId, part: r.kind === "factual" ? "factual" : "projected", corrected } },
      corrected ? "Marked as corrected by the client." : "Correction removed.",
    ).then(() => setCorrecting(null));
  return (
    <div className="space-y-6">
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      {editing && (
        <div className="rounded-card border border-ink-line bg-paper p-4">
          <EntryForm engagementId={view.engagement.id} editing={editing} onDone={() => setEditing(null)} />
        </div>
      )}
      {view.rows.length === 0 && (
        <p className="text-sm text-ink-soft">
          Nothing to summarise yet: no sample has monetary results and the team has entered no misstatement.
        </p>
      )}
      {GROUPS.map((g) => {
        const rows = view.rows.filter(g.test);
        if (rows.length === 0) return null;
        return (
          <Table key={g.title} density="compact">
            <caption className="mb-2 text-left font-semibold">{g.title}</caption>
            <THead>
              <tr className="border-b border-ink-line text-left text-xs uppercase tracking-wider text-ink-soft">
                <Th className="font-medium">Ref</Th>
                <Th className="font-medium">Kind</Th>
                <Th className="font-medium">Account · assertion</Th>
                <Th className="font-medium">Description</Th>
                <Th numeric className="font-medium">
                  Amount
                </Th>
                <Th numeric className="font-medium">
                  Income statement
                </Th>
                <Th numeric className="font-medium">
                  Balance sheet
                </Th>
                <Th numeric className="font-medium">
                  Allowance
                </Th>
                <Th className="font-medium">Treatment</Th>
              </tr>
            </THead>
            <tbody>
              {rows.map((r) => (
                <tr
                  key={r.key}
                  id={r.entryId ? `entry-${r.entryId}` : undefined}
                  className="border-b border-ink-line/60 align-top"
                  data-testid={`summary-row-${r.key}`}
                >
                  <Td>
                    <Link href={r.link} className="font-medium text-ledger-700 underline">
                      {r.reference}
                    </Link>
                  </Td>
                  <Td>{KIND_LABELS[r.kind]}</Td>
                  <Td>
                    {r.account}
                    <div className="text-xs text-ink-faint">{r.assertion}</div>
                  </Td>
                  <Td className="max-w-md">
                    {r.description}
                    {r.allowanceNote && <div className="text-xs text-ink-faint">{r.allowanceNote}</div>}
                    {r.frozen && <div className="text-xs text-ink-faint">Frozen at the sample&apos;s lock.</div>}
                    {r.source === "entry" && (
                      <EntryEvidence
                        engagementId={view.engagement.id}
                        entryId={r.entryId!}
                        count={r.evidenceCount}
                        mayWrite={mayEdit}
                      />
                    )}
                    {correcting === r.key && (
                      <CorrectionForm busy={busy} onSave={(c) => correct(r, c)} onCancel={() => setCorrecting(null)} />
                    )}
                  </Td>
                  <Td className="text-right">{money(r.amount)}</Td>
                  <Td className="text-right">{money(r.incomeEffect)}</Td>
                  <Td className="text-right">{money(r.balanceEffect)}</Td>
                  <Td className="text-right">{money(r.allowance)}</Td>
                  <Td>
                    <div className="text-xs">{treatmentOf(r)}</div>
                    {mayEdit &&
                      r.source === "sample" &&
                      (r.corrected ? (
                        <Button
                          variant="ghost"
                          className="mt-1 px-2 py-1 text-xs"
                          disabled={busy}
                          onClick={() => correct(r, null)}
                        >
                          Not corrected
                        </Button>
                      ) : (
                        <Button variant="ghost" className="mt-1 px-2 py-1 text-xs" onClick={() => setCorrecting(r.key)}>
                          Mark corrected
                        </Button>
                      ))}
                    {mayEdit && r.source === "entry" && (
                      <div className="mt-1 flex gap-1">
                        <Button
                          variant="ghost"
                          className="px-2 py-1 text-xs"
                          onClick={() => edit(r)}
                          aria-label={`Edit ${r.reference}`}
                        >
                          Edit
                        </Button>
                        <Button
                          variant="ghost"
                          className="px-2 py-1 text-xs"
                          disabled={busy}
                          aria-label={`Remove ${r.reference}`}
                          onClick={() => {
                            if (window.confirm(`Remove ${r.reference} from the summary? It stays in the audit trail.`))
                              void act(`/entries/${r.entryId}`, { method: "DELETE" }, "Entry removed.");
                          }}
                        >
                          Remove
                        </Button>
                      </div>
                    )}
                  </Td>
                </tr>
              ))}
            </tbody>
          </Table>
        );
      })}
    </div>
  );
}
