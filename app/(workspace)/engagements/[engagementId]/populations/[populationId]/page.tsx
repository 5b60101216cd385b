import type { Metadata } from "next";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { loadPopulationPage } from "@/lib/views/engagement-pages";
import { Card } from "@/components/ui/card";
import { Amount } from "@/components/ui/amount";
import { PopulationHeader } from "@/components/populations/population-header";
import { Alert } from "@/components/ui/alert";
import { PopulationActions } from "@/components/populations/population-actions";
import { ReconciliationPanel } from "@/components/populations/reconciliation-panel";
import { SummaryCards } from "@/components/populations/summary-cards";
import { StrataChart } from "@/components/populations/strata-chart";
import { DuplicateRefs, LargestItems } from "@/components/populations/profile-tables";
import { ThresholdTool } from "@/components/populations/threshold-tool";
import { ItemsGrid } from "@/components/populations/items-grid";

export const metadata: Metadata = { title: "Population" };

export default async function PopulationPage({
  params,
}: {
  params: Promise<{ engagementId: string; populationId: string }>;
}) {
  const { engagementId, populationId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { population, profile, all, samples } = await loadPopulationPage(engagement.id, populationId);
  const replacedBy = all.find((p) => p.supersedesId === population.id) ?? null;
  const replaces =
    population.supersedesId === null ? null : (all.find((p) => p.id === population.supersedesId) ?? null);
  const api = `/api/engagements/${engagement.id}/populations/${population.id}`;
  return (
    <>
      <PopulationHeader population={population} engagement={engagement} replacedBy={replacedBy} replaces={replaces} />
      {population.archivedAt && (
        <div className="mb-4">
          <Alert tone="info">
            This population is archived: it is kept with its samples but left out of the engagement&apos;s list and the
            sample planner.
          </Alert>
        </div>
      )}
      {hasAtLeastRole(role, "senior") && (
        <div className="mb-6">
          <PopulationActions
            base={api}
            engagementUrl={`/engagements/${engagement.id}`}
            name={population.name}
            archived={Boolean(population.archivedAt)}
            replaced={Boolean(replacedBy)}
            usedBy={samples.filter((s) => s.populationId === population.id).map((s) => s.name)}
          />
        </div>
      )}
      <div className="space-y-6">
        <div className="grid items-start gap-6 lg:grid-cols-5">
          <Card title="Reconciliation to the ledger" className="lg:col-span-3">
            <ReconciliationPanel
              engagementId={engagement.id}
              initial={population}
              currency={engagement.currency}
              mayReconcile={hasAtLeastRole(role, "senior")}
            />
          </Card>
          <Card title="Items at or above an amount" className="lg:col-span-2">
            <ThresholdTool
              url={`${api}/profile`}
              populationCount={population.rowCount}
              positiveTotal={population.positive.total}
              currency={engagement.currency}
              suggestion={engagement.performanceMateriality}
            />
            <p className="mt-3 text-xs text-ink-soft">
              Useful for sizing a top stratum: items at or above the cut-off are usually tested in full. Performance
              materiality on this engagement:{" "}
              <Amount value={engagement.performanceMateriality} currency={engagement.currency} />.
            </p>
          </Card>
        </div>
        <SummaryCards population={population} currency={engagement.currency} />
        <Card title="Book-value strata">
          {profile.strata.length > 0 ? (
            <StrataChart strata={profile.strata} />
          ) : (
            <p className="text-sm text-ink-soft">No items.</p>
          )}
        </Card>
        <div className="grid gap-6 lg:grid-cols-2">
          <Card title="Largest items">
            <LargestItems items={profile.largest} currency={engagement.currency} />
          </Card>
          <Card title="Duplicate item references">
            <DuplicateRefs duplicates={profile.duplicates} duplicateRefCount={profile.duplicateRefCount} />
          </Card>
        </div>
        <Card title="Items">
          <ItemsGrid
            url={`${api}/items`}
            extraColumns={population.mapping.extraColumns ?? []}
            hasDescription={Boolean(population.mapping.descriptionColumn)}
            hasDate={Boolean(population.mapping.dateColumn)}
          />
        </Card>
      </div>
    </>
  );
}
