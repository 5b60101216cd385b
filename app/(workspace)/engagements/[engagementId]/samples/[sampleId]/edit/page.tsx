import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { PageHeader } from "@/components/ui/page-header";
import { Alert } from "@/components/ui/alert";
import { PlanForm } from "@/components/samples/plan-form";
import { fromStored } from "@/components/samples/plan-values";
import { loadEditPlanPage } from "@/lib/views/sample-page";

export const metadata: Metadata = { title: "Change a sample plan" };

export default async function EditSamplePage({
  params,
}: {
  params: Promise<{ engagementId: string; sampleId: string }>;
}) {
  const { engagementId, sampleId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { view, populations, samples } = await loadEditPlanPage(engagement.id, sampleId);
  const { sample } = view;
  const back = (
    <Link href={`/engagements/${engagement.id}/samples/${sample.id}`} className="link">
      {sample.name}
    </Link>
  );
  if (!hasAtLeastRole(role, "senior") || sample.status !== "planned") {
    return (
      <>
        <PageHeader eyebrow={engagement.clientName} title="Change a sample plan">
          {back}
        </PageHeader>
        <Alert>
          {sample.status !== "planned"
            ? "This sample has been drawn; its plan is final. Plan a new sample instead."
            : "Changing a plan needs the senior role (or above) on this engagement."}
        </Alert>
      </>
    );
  }
  const choices = populations.map(({ id, name, rowCount, total, status, positive }) => ({
    id,
    name,
    rowCount,
    total,
    status,
    positive,
  }));
  const earlierSamples = samples
    .filter((s) => s.status === "drawn" && s.method !== "attribute" && s.id !== sample.id)
    .map(({ id, name }) => ({ id, name }));
  const values = fromStored({
    populationId: sample.populationId,
    name: sample.name,
    objective: sample.objective,
    assertion: sample.assertion,
    direction: sample.direction,
    params: sample.params,
  });
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title="Change a sample plan">
        {back} · possible until the sample is drawn
      </PageHeader>
      <PlanForm
        engagementId={engagement.id}
        currency={engagement.currency}
        performanceMateriality={engagement.performanceMateriality}
        populations={choices}
        editing={{ sampleId: sample.id, values }}
        earlierSamples={earlierSamples}
      />
    </>
  );
}
