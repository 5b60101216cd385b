import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { PageHeader } from "@/components/ui/page-header";
import { Badge } from "@/components/ui/badge";
import { PlanSummary } from "@/components/samples/plan-summary";
import { SampleWorkspace } from "@/components/samples/sample-workspace";
import { METHOD_SHORT, SAMPLE_STATUS_LABELS } from "@/components/samples/labels";
import { loadSampleScreen } from "@/lib/views/sample-page";
import { notesOnItems } from "@/components/review/note-labels";
import { Alert } from "@/components/ui/alert";
import { ReviewPanel } from "@/components/review/review-panel";
import { FieldworkFiles } from "@/components/review/fieldwork-files";
import { AdvisorPanel } from "@/components/advisor/advisor-panel";
import { RequestListsCard } from "@/components/requests/request-lists-card";
import { SupersededBanner } from "@/components/samples/superseded-banner";

export const metadata: Metadata = { title: "Sample" };

export default async function SamplePage({ params }: { params: Promise<{ engagementId: string; sampleId: string }> }) {
  const { engagementId, sampleId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const {
    view,
    evaluation,
    items: drawnItems,
    notes,
    advisor,
    requestLists,
    replacement,
  } = await loadSampleScreen(engagement.id, sampleId);
  const { sample, population } = view;
  const locked = Boolean(view.review.lock);
  const senior = hasAtLeastRole(role, "senior") && !locked;
  const items = drawnItems.filter((i) => i.status !== "void").map((i) => ({ id: i.id, itemRef: i.itemRef }));
  const notesByItem = notesOnItems(notes);
  const editHref =
    senior && sample.status === "planned" ? `/engagements/${engagement.id}/samples/${sample.id}/edit` : null;
  return (
    <div data-wide>
      <PageHeader
        eyebrow={engagement.clientName}
        title={sample.name}
        actions={
          locked ? (
            <Badge tone="green">Locked — final</Badge>
          ) : (
            <Badge tone={sample.status === "drawn" ? "green" : "blue"}>{SAMPLE_STATUS_LABELS[sample.status]}</Badge>
          )
        }
      >
        <Link href={`/engagements/${engagement.id}`} className="link">
          {engagement.name}
        </Link>
        {" · "}
        {METHOD_SHORT[sample.method]}
        {" · from "}
        <Link href={`/engagements/${engagement.id}/populations/${population.id}`} className="link">
          {population.name}
        </Link>
      </PageHeader>
      {population.status === "superseded" && (
        <SupersededBanner engagementId={engagement.id} population={population} replacement={replacement} />
      )}
      <SampleWorkspace
        key={sample.id}
        engagementId={engagement.id}
        initialView={view}
        initialEvaluation={evaluation}
        may={{
          record: hasAtLeastRole(role, "staff") && !locked,
          draw: senior,
          acceptAnomaly: hasAtLeastRole(role, "manager") && !locked,
        }}
        notesByItem={notesByItem}
        anomaliesAllowed={sample.methodology.anomaliesAllowed}
        planSummary={
          <PlanSummary
            sample={sample}
            currency={engagement.currency}
            performanceMateriality={engagement.performanceMateriality}
            editHref={editHref}
          />
        }
      />
      {advisor && (sample.status === "planned" || advisor.adopted) && (
        <div className="mt-6">
          <AdvisorPanel
            engagementId={engagement.id}
            sampleId={sample.id}
            initial={advisor}
            mayRun={senior}
            currency={engagement.currency}
            plannedSize={sample.chosenSize}
            populationItems={population.rowCount}
          />
        </div>
      )}
      {locked && (
        <div className="mt-6">
          <Alert tone="info">
            This sample is locked. Its workpaper is final and every part of it is read-only; a partner can unlock it
            with a reason.
          </Alert>
        </div>
      )}
      <div className="mt-6 grid gap-6 lg:grid-cols-2">
        <ReviewPanel
          engagementId={engagement.id}
          sampleId={sample.id}
          role={role}
          review={view.review}
          notes={notes}
          items={items}
          drawn={Boolean(view.currentDraw)}
          computed={evaluation.computed}
          complete={evaluation.complete}
          openLists={requestLists
            .filter((l) => l.status === "open")
            .map((l) => ({ id: l.id, title: l.title, contactName: l.contactName }))}
        />
        {view.currentDraw && (
          <RequestListsCard
            base={`/engagements/${engagement.id}/samples/${sample.id}`}
            lists={requestLists}
            mayCreate={senior}
          />
        )}
        {view.currentDraw && (
          <FieldworkFiles
            engagementId={engagement.id}
            sampleId={sample.id}
            mayWrite={!locked && hasAtLeastRole(role, "staff")}
          />
        )}
      </div>
    </div>
  );
}
