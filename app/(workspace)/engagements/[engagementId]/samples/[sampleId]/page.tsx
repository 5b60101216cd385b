import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { PageHeader } from "@/components/ui/page-header";
import { Badge } from "@/components/ui/badge";
import { PlanSummary } from "@/components/samples/plan-summary";
import { SampleWorkspace } from "@/components/samples/sample-workspace";
import { METHOD_SHORT, SAMPLE_STATUS_LABELS } from "@/components/samples/labels";
import { loadSamplePage } from "./load-sample";

export const metadata: Metadata = { title: "Sample" };

export default async function SamplePage({ params }: { params: Promise<{ engagementId: string; sampleId: string }> }) {
  const { engagementId, sampleId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { view, evaluation } = await loadSamplePage(engagement.id, sampleId);
  const { sample, population } = view;
  const senior = hasAtLeastRole(role, "senior");
  const editHref = senior && sample.status === "planned" ? `/engagements/${engagement.id}/samples/${sample.id}/edit` : null;
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title={sample.name}
        actions={<Badge tone={sample.status === "drawn" ? "green" : "blue"}>{SAMPLE_STATUS_LABELS[sample.status]}</Badge>}>
        <Link href={`/engagements/${engagement.id}`} className="hover:underline">{engagement.name}</Link>
        {" · "}{METHOD_SHORT[sample.method]}
        {" · from "}<Link href={`/engagements/${engagement.id}/populations/${population.id}`} className="hover:underline">{population.name}</Link>
      </PageHeader>
      <SampleWorkspace
        key={sample.id} engagementId={engagement.id} initialView={view} initialEvaluation={evaluation}
        may={{ record: hasAtLeastRole(role, "staff"), draw: senior }}
        planSummary={<PlanSummary sample={sample} currency={engagement.currency} performanceMateriality={engagement.performanceMateriality} editHref={editHref} />}
      />
    </>
  );
}
