"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import type { ReviewState } from "@/lib/review/review-state";
import type { ReviewNote } from "@/lib/data/review-notes";
import { apiFetch } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button, buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ExplainedButton as Action } from "@/components/ui/explained-button";
import { ReviewNotes, type NoteItem } from "./review-notes";
import { ConclusionForm } from "./conclusion-form";
import type { ComputedResult } from "@/lib/samples/evaluation-types";
import { LockDialog, type OpenList } from "./lock-dialog";
import { preparerSignOffBlocker, reviewerSignOffBlocker } from "@/lib/review/sign-off-blockers";
import { formatDateTime } from "@/lib/format/date";

interface Props {
  engagementId: number;
  sampleId: number;
  role: EngagementRole;
  review: ReviewState;
  notes: ReviewNote[];
  drawn: boolean;
  computed: ComputedResult;
  complete: boolean;
  openLists: OpenList[];
  items: NoteItem[];
}

const when = formatDateTime;

/** Sign-offs, lock and the workpaper: the panel where a sample becomes final. */
export function ReviewPanel({
  engagementId,
  sampleId,
  role,
  review,
  notes,
  drawn,
  computed,
  complete,
  openLists,
  items,
}: Props) {
  const [confirming, setConfirming] = useState(false);
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const base = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const isReviewer = hasAtLeastRole(role, "manager");
  const isPreparer = role === "staff" || role === "senior";
  const preparerBlocked = preparerSignOffBlocker({
    drawn,
    complete,
    concluded: review.conclusion,
    responseNeeded: computed.responseNeeded,
  });
  const reviewerBlocked = reviewerSignOffBlocker({
    preparerSigned: Boolean(review.preparer),
    concluded: Boolean(review.conclusion),
    openNotes: review.openNotes,
  });

  async function act(path: string, body: unknown, done: string) {
    setBusy(true);
    setMessage(null);
    try {
      await apiFetch(`${base}/${path}`, { body });
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
    if (reason)
      void act(
        "unlock",
        { reason },
        "Unlocked. The reviewer sign-off was cleared; the earlier workpaper stays on record.",
      );
  }

  const line = (label: string, s: ReviewState["preparer"]) => (
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

  return (
    <Card
      title="Review and sign-off"
      action={
        review.lock ? (
          <Badge tone="green">Locked — final</Badge>
        ) : review.reviewer ? (
          <Badge tone="blue">Reviewed</Badge>
        ) : review.preparer ? (
          <Badge tone="amber">Awaiting review</Badge>
        ) : (
          <Badge>In preparation</Badge>
        )
      }
    >
      <div className="space-y-4">
        {message && <Alert tone={message.tone}>{message.text}</Alert>}
        <div>
          {line("Prepared by", review.preparer)}
          {line("Reviewed by", review.reviewer)}
          {review.lock && (
            <div className="py-2 text-sm">
              <p>
                <span className="text-ink-soft">Locked by</span> <span className="font-medium">{review.lock.name}</span>{" "}
                <span className="text-ink-faint">
                  · {when(review.lock.at)} · {review.lock.reference}
                </span>
              </p>
              <p className="mt-1 break-all text-xs text-ink-faint">
                Workpaper SHA-256{" "}
                <span className="figures text-ink" data-testid="workpaper-sha256">
                  {review.lock.workpaperSha256}
                </span>
              </p>
            </div>
          )}
        </div>
        {drawn && (
          <ConclusionForm
            base={base}
            computed={computed}
            complete={complete}
            conclusion={review.conclusion}
            mayWrite={isPreparer && !review.lock}
          />
        )}
        <div className="flex flex-wrap items-start gap-2">
          {!review.lock &&
            isPreparer &&
            (review.preparer ? (
              <Action disabled why="You have signed off as preparer. A change to the work clears it; then sign again.">
                Signed off as preparer
              </Action>
            ) : (
              <Action
                disabled={busy || preparerBlocked !== null}
                why={preparerBlocked ?? undefined}
                onClick={() =>
                  act("sign-off", { as: "preparer" }, "Signed off as preparer; the reviewers have been told.")
                }
              >
                Sign off as preparer
              </Action>
            ))}
          {!review.lock &&
            isReviewer &&
            (review.reviewer ? (
              <Action disabled why="Signed off as reviewer. A change to the work clears it.">
                Signed off as reviewer
              </Action>
            ) : (
              <Action
                disabled={busy || reviewerBlocked !== null}
                why={reviewerBlocked ?? undefined}
                onClick={() => act("sign-off", { as: "reviewer" }, "Signed off as reviewer.")}
              >
                Sign off as reviewer
              </Action>
            ))}
          {!review.lock && isReviewer && (
            <Action
              variant="secondary"
              disabled={busy || !review.reviewer}
              why={!review.reviewer ? "A reviewer signs off before the sample is locked." : undefined}
              onClick={() => setConfirming(true)}
            >
              Lock sample…
            </Action>
          )}
          {review.lock && role === "partner" && (
            <Button variant="danger" disabled={busy} onClick={unlock}>
              Unlock…
            </Button>
          )}
          {drawn && (
            <a className={buttonClass("secondary")} href={`${base}/workpaper`}>
              {review.lock ? "Download signed-off workpaper (PDF)" : "Download draft workpaper (PDF)"}
            </a>
          )}
          <a className={buttonClass("ghost")} href={`/engagements/${engagementId}/samples/${sampleId}/trail`}>
            Audit trail
          </a>
        </div>
        <LockDialog
          open={confirming}
          openLists={openLists}
          busy={busy}
          onCancel={() => setConfirming(false)}
          onConfirm={() => {
            void act(
              "lock",
              {},
              `Locked. The final workpaper was rendered once and stored with its SHA-256${openLists.length ? `; ${openLists.length === 1 ? "the open request list was" : `${openLists.length} open request lists were`} closed and the client told` : ""}.`,
            ).then(() => setConfirming(false));
          }}
        />
        <p className="text-xs text-ink-faint">
          Any change to the plan, selection, results or evidence clears the sign-offs and the auditor&apos;s conclusion.
          The preparer signs off after recording the conclusion (and the response, where the computed result calls for
          one); the reviewer&apos;s sign-off covers them. A reviewer cannot sign off while a note is open.
        </p>
        <ReviewNotes
          engagementId={engagementId}
          sampleId={sampleId}
          role={role}
          notes={notes}
          items={items}
          locked={Boolean(review.lock)}
          onChanged={() => router.refresh()}
        />
      </div>
    </Card>
  );
}
