"use client";
import { useState } from "react";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { SummaryView } from "@/lib/misstatements/types";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { ExplainedButton } from "@/components/ui/explained-button";
import { useSummaryAction } from "./use-summary-action";
import { SummaryNotes } from "./summary-notes";
import { formatDateTime } from "@/lib/format/date";

const when = formatDateTime;

/** Sign-offs, review notes, lock and unlock of the summary. */
export function SummaryReview({ view, role }: { view: SummaryView; role: EngagementRole }) {
  const { act, busy, message, setMessage } = useSummaryAction(view.engagement.id);
  const [confirming, setConfirming] = useState(false);
  const r = view.review;
  const locked = r.lock !== null;
  const isReviewer = hasAtLeastRole(role, "manager");
  const line = (label: string, s: SummaryView["review"]["preparer"]) => (
    <div className="flex items-baseline justify-between gap-4 border-b border-ink-line/60 py-2 text-sm">
      <span className="text-ink-soft">{label}</span>
      {s ? (
        <span>
          <span className="font-medium">{s.name}</span>{" "}
          <span className="text-ink-faint">
            · {s.role} · {when(s.at)}
          </span>
        </span>
      ) : (
        <span className="text-ink-faint">not signed</span>
      )}
    </div>
  );
  const unlock = () => {
    const reason = window.prompt("Why must the locked summary change? (kept in the audit trail)");
    if (reason)
      void act(
        "/unlock",
        { body: { reason } },
        "Unlocked. The reviewer sign-off was cleared; the earlier workpaper stays on record.",
      );
  };
  return (
    <Card
      title="Review and sign-off"
      action={
        locked ? (
          <Badge tone="green">Locked — final</Badge>
        ) : r.reviewer ? (
          <Badge tone="blue">Reviewed</Badge>
        ) : r.preparer ? (
          <Badge tone="amber">Awaiting review</Badge>
        ) : (
          <Badge>In preparation</Badge>
        )
      }
    >
      <div className="space-y-4">
        {message && <Alert tone={message.tone}>{message.text}</Alert>}
        {r.staleSignOffs && (
          <Alert tone="info">
            A sample&apos;s results changed after the sign-offs: they no longer apply. Sign off again.
          </Alert>
        )}
        <div>
          {line("Prepared by", r.preparer)}
          {line("Reviewed by", r.reviewer)}
          {r.lock && (
            <div className="py-2 text-sm">
              <span className="text-ink-soft">Locked by</span> <span className="font-medium">{r.lock.name}</span>{" "}
              <span className="text-ink-faint">· {when(r.lock.at)}</span>
              <div className="break-all text-xs text-ink-faint">PDF SHA-256 {r.lock.workpaperSha256}</div>
            </div>
          )}
        </div>
        {!locked && (
          <div className="flex flex-wrap items-start gap-2">
            {(role === "staff" || role === "senior") &&
              (r.preparer ? (
                <ExplainedButton
                  variant="secondary"
                  disabled
                  why="You have signed off as preparer. A change to the rows clears it; then sign again."
                >
                  Signed off as preparer
                </ExplainedButton>
              ) : (
                <ExplainedButton
                  variant="secondary"
                  disabled={busy}
                  onClick={() => void act("/sign-off", { body: { as: "preparer" } }, "Signed off as preparer.")}
                >
                  Sign off as preparer
                </ExplainedButton>
              ))}
            {isReviewer &&
              (r.reviewer ? (
                <ExplainedButton
                  variant="secondary"
                  disabled
                  why="Signed off as reviewer. A change to the rows clears it."
                >
                  Signed off as reviewer
                </ExplainedButton>
              ) : (
                <ExplainedButton
                  variant="secondary"
                  disabled={busy || r.reviewerBlocker !== null}
                  why={r.reviewerBlocker ?? undefined}
                  onClick={() => void act("/sign-off", { body: { as: "reviewer" } }, "Signed off as reviewer.")}
                >
                  Sign off as reviewer
                </ExplainedButton>
              ))}
            {isReviewer && (
              <Button disabled={busy || !r.lockable.ok} onClick={() => setConfirming(true)}>
                Lock the summary…
              </Button>
            )}
          </div>
        )}
        {!locked && isReviewer && !r.lockable.ok && (
          <ul className="list-disc pl-5 text-xs text-ink-soft">
            {r.lockable.reasons.map((x) => (
              <li key={x}>{x}</li>
            ))}
          </ul>
        )}
        <ConfirmDialog
          open={confirming}
          title="Lock the summary of misstatements?"
          confirmLabel="Lock the summary"
          busyLabel="Locking…"
          busy={busy}
          onCancel={() => setConfirming(false)}
          onConfirm={() =>
            void act("/lock", { body: {} }, "Locked: the workpaper is final and stored with its SHA-256.").then(() =>
              setConfirming(false),
            )
          }
        >
          <p>Locking makes the summary final. It will:</p>
          <ul className="list-disc space-y-1 pl-5">
            <li>render the summary&apos;s workpaper (PDF) once and keep it with its SHA-256 fingerprint;</li>
            <li>
              freeze the rows, totals and status as they stand, and make entries, corrections, thresholds and review
              notes read-only — only a partner can unlock, giving a reason.
            </li>
          </ul>
        </ConfirmDialog>
        {locked && role === "partner" && (
          <Button variant="danger" disabled={busy} onClick={unlock}>
            Unlock (partner)
          </Button>
        )}
        <SummaryNotes
          notes={view.notes}
          role={role}
          locked={locked}
          busy={busy}
          act={act}
          refuse={(text) => setMessage({ tone: "error", text })}
        />
      </div>
    </Card>
  );
}
