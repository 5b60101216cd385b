import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole, ROLE_LABELS } from "@/lib/auth/roles";
import { loadPlanChoices } from "@/lib/views/sample-page";
import { PageHeader } from "@/components/ui/page-header";
import { Alert } from "@/components/ui/alert";
import { PlanForm } from "@/components/samples/plan-form";

export const metadata: Metadata = { title: "Plan a sample" };

export default async function NewSamplePage({
  params,
  searchParams,
}: {
  params: Promise<{ engagementId: string }>;
  searchParams: Promise<{ population?: string }>;
}) {
  const [{ engagementId }, query] = await Promise.all([params, searchParams]);
  const { engagement, role } = await requireEngagementPage(engagementId);
  const mayPlan = hasAtLeastRole(role, "senior");
  const { populations, samples } = mayPlan ? await loadPlanChoices(engagement.id) : { populations: [], samples: [] };
  const earlierSamples = samples
    .filter((s) => s.status === "drawn" && s.method !== "attribute")
    .map(({ id, name }) => ({ id, name }));
  const choices = populations
    .filter((p) => !p.archivedAt)
    .map(({ id, name, rowCount, total, status, positive }) => ({ id, name, rowCount, total, status, positive }));
  const preset = choices.find((p) => p.id === Number(query.population) && p.status === "reconciled")?.id;
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title="Plan a sample">
        <Link href={`/engagements/${engagement.id}`} className="link">
          {engagement.name}
        </Link>{" "}
        · the size is computed on the server as you type, from the population as loaded.
      </PageHeader>
      {mayPlan ? (
        <PlanForm
          engagementId={engagement.id}
          currency={engagement.currency}
          performanceMateriality={engagement.performanceMateriality}
          populations={choices}
          initialPopulationId={preset}
          earlierSamples={earlierSamples}
        />
      ) : (
        <Alert>
          Planning a sample needs the senior role (or above) on this engagement; you are{" "}
          {ROLE_LABELS[role].toLowerCase()}.
        </Alert>
      )}
    </>
  );
}
