import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole, ROLE_LABELS } from "@/lib/auth/roles";
import { loadPlanChoices } from "@/lib/views/sample-page";
import { PageHeader } from "@/components/ui/page-header";
import { Card } from "@/components/ui/card";
import { Alert } from "@/components/ui/alert";
import { UploadFlow } from "@/components/populations/upload-flow";

export const metadata: Metadata = { title: "Load a ledger" };

export default async function NewPopulationPage({ params }: { params: Promise<{ engagementId: string }> }) {
  const { engagementId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const mayLoad = hasAtLeastRole(role, "senior");
  const { populations, samples } = mayLoad ? await loadPlanChoices(engagement.id) : { populations: [], samples: [] };
  const replaceable = populations
    .filter((p) => p.status !== "superseded")
    .map((p) => ({
      id: p.id,
      name: p.name,
      rowCount: p.rowCount,
      samples: samples.filter((s) => s.populationId === p.id).map((s) => s.name),
    }));
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title="Load a ledger population">
        <Link href={`/engagements/${engagement.id}`} className="link">
          {engagement.name}
        </Link>{" "}
        · the file is kept exactly as received, with its SHA-256, beside the population.
      </PageHeader>
      {mayLoad ? (
        <Card>
          <UploadFlow engagementId={engagement.id} currency={engagement.currency} replaceable={replaceable} />
        </Card>
      ) : (
        <Alert>
          Loading a population needs the senior role (or above) on this engagement; you are{" "}
          {ROLE_LABELS[role].toLowerCase()}. Ask the senior or manager on the team to load the ledger.
        </Alert>
      )}
    </>
  );
}
