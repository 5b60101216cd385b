"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { ReviewState } from "@/lib/review/review-state";
import type { ReviewNote } from "@/lib/review/notes";
import { api } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button, buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ReviewNotes } from "./review-notes";
import { ConclusionForm } from "./conclusion-form";
import type { ComputedResult } from "@/lib/samples/evaluation-types";

interface Props { engagementId: number; sampleId: number; role: EngagementRole; review: ReviewState; notes: ReviewNote[]; drawn: boolean; computed: ComputedResult; complete: boolean }

const when = (iso: string) => new Date(iso).toISOString().replace("T", " ").slice(0, 16) + " UTC";

/** Sign-offs, lock and the workpaper: the panel where a sample becomes final. */
export function ReviewPanel({ engagementId, sampleId, role, review, notes, drawn, computed, complete }: Props) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const base = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const isReviewer = hasAtLeastRole(role, "manager");
  const isPreparer = role === "staff" || role === "senior";

  async function act(path: string, body: unknown, done: string) {
    setBusy(true);
    setMessage(null);
    try {
      await api(`${base}/${path}`, { body });
      setMessage({ tone: "success", text: done });
      router.refresh();
    } catch (err) {
      setMessage({ tone: "error", text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  function unlock() {
    const reason = window.prompt("Why must this locked sample change? (kept in the audit trail)");
    if (reason) void act("unlock", { reason }, "Unlocked. The reviewer sign-off was cleared; the earlier workpaper stays on record.");
  }

  const line = (label: string, s: ReviewState["preparer"]) => (
    <div className="flex items-baseline justify-between gap-4 border-b border-ink-line/60 py-2 text-sm">
      <span className="text-ink-soft">{label}</span>
      {s ? <span><span className="font-medium">{s.name}</span> <span className="text-ink-faint">· {s.role} · {when(s.at)}</span></span> : <span className="text-ink-faint">not signed</span>}
    </div>
  );

  return (
    <Card title="Review and sign-off" action={review.lock ? <Badge tone="green">Locked — final</Badge> : review.reviewer ? <Badge tone="blue">Reviewed</Badge> : review.preparer ? <Badge tone="amber">Awaiting review</Badge> : <Badge>In preparation</Badge>}>
      <div className="space-y-4">
        {message && <Alert tone={message.tone}>{message.text}</Alert>}
        <div>
          {line("Prepared by", review.preparer)}
          {line("Reviewed by", review.reviewer)}
          {review.lock && (
            <div className="py-2 text-sm">
              <p><span className="text-ink-soft">Locked by</span> <span className="font-medium">{review.lock.name}</span> <span className="text-ink-faint">· {when(review.lock.at)} · {review.lock.reference}</span></p>
              <p className="mt-1 break-all text-xs text-ink-faint">Workpaper SHA-256 <span className="figures text-ink" data-testid="workpaper-sha256">{review.lock.workpaperSha256}</span></p>
            </div>
          )}
        </div>
        {drawn && <ConclusionForm key={review.conclusion?.writtenAt ?? "none"} base={base} computed={computed} complete={complete} conclusion={review.conclusion} mayWrite={isPreparer && !review.lock} />}
        <div className="flex flex-wrap gap-2">
          {!review.lock && isPreparer && <Button disabled={busy || !drawn} onClick={() => act("sign-off", { as: "preparer" }, "Signed off as preparer; the reviewers have been told.")}>Sign off as preparer</Button>}
          {!review.lock && isReviewer && <Button disabled={busy || !review.preparer} onClick={() => act("sign-off", { as: "reviewer" }, "Signed off as reviewer.")}>Sign off as reviewer</Button>}
          {!review.lock && isReviewer && <Button variant="secondary" disabled={busy || !review.reviewer} onClick={() => act("lock", {}, "Locked. The final workpaper was rendered once and stored with its SHA-256.")}>Lock sample</Button>}
          {review.lock && role === "partner" && <Button variant="danger" disabled={busy} onClick={unlock}>Unlock…</Button>}
          {drawn && <a className={buttonClass("secondary")} href={`${base}/workpaper`}>{review.lock ? "Download signed-off workpaper (PDF)" : "Download draft workpaper (PDF)"}</a>}
          <a className={buttonClass("ghost")} href={`/engagements/${engagementId}/samples/${sampleId}/trail`}>Audit trail</a>
        </div>
        <p className="text-xs text-ink-faint">Any change to the plan, selection, results or evidence clears the sign-offs and the auditor&apos;s conclusion. The preparer signs off after recording the conclusion (and the response, where the computed result calls for one); the reviewer&apos;s sign-off covers them. A reviewer cannot sign off while a note is open.</p>
        <ReviewNotes engagementId={engagementId} sampleId={sampleId} role={role} notes={notes} locked={Boolean(review.lock)} onChanged={() => router.refresh()} />
      </div>
    </Card>
  );
}
