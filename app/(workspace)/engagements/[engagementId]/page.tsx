import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole, ROLE_LABELS } from "@/lib/auth/roles";
import { PopulationList } from "@/components/populations/population-list";
import { SampleList } from "@/components/samples/sample-list";
import { loadEngagementOverview } from "@/lib/views/engagement-pages";
import { PageHeader } from "@/components/ui/page-header";
import { Card } from "@/components/ui/card";
import { Badge } from "@/components/ui/badge";
import { Amount } from "@/components/ui/amount";
import { STATUS_LABELS, statusTone } from "@/components/engagements/status";
import { EngagementTabs } from "@/components/engagements/engagement-tabs";
import { formatDate } from "@/lib/format/date";

export const metadata: Metadata = { title: "Engagement" };

export default async function EngagementPage({ params }: { params: Promise<{ engagementId: string }> }) {
  const { engagementId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { members, populations, samples, overviews } = await loadEngagementOverview(engagement.id);
  const facts: [string, React.ReactNode][] = [
    ["Client", engagement.clientName],
    ["Period end", formatDate(engagement.periodEnd)],
    ["Currency", engagement.currency],
    ["Overall materiality", <Amount key="o" value={engagement.overallMateriality} />],
    ["Performance materiality", <Amount key="pm" value={engagement.performanceMateriality} />],
    ["Your role", ROLE_LABELS[role]],
  ];
  return (
    <>
      <PageHeader
        eyebrow={engagement.clientName}
        title={engagement.name}
        actions={<Badge tone={statusTone(engagement.status)}>{STATUS_LABELS[engagement.status]}</Badge>}
      >
        Period ended {formatDate(engagement.periodEnd)}
      </PageHeader>
      <EngagementTabs engagementId={engagement.id} current="overview" />
      <div className="grid gap-6 lg:grid-cols-3">
        <Card title="Engagement" className="lg:col-span-2">
          <dl className="grid gap-x-8 gap-y-3 sm:grid-cols-2">
            {facts.map(([label, value]) => (
              <div key={label} className="flex items-baseline justify-between gap-4 border-b border-ink-line/60 pb-2">
                <dt className="text-sm text-ink-soft">{label}</dt>
                <dd className="text-right text-sm font-medium">{value}</dd>
              </div>
            ))}
          </dl>
        </Card>
        <Card
          title="Team"
          action={
            hasAtLeastRole(role, "manager") && (
              <Link href={`/engagements/${engagement.id}/team`} className="text-sm font-medium text-ledger-600 link">
                Manage
              </Link>
            )
          }
        >
          <ul className="space-y-2">
            {members.map((m) => (
              <li key={m.userId} className="flex items-center justify-between text-sm">
                <span>{m.name}</span>
                <span className="text-xs uppercase tracking-wider text-ink-faint">{ROLE_LABELS[m.role]}</span>
              </li>
            ))}
          </ul>
        </Card>
        <Card
          title="Populations"
          className="lg:col-span-3"
          action={
            hasAtLeastRole(role, "senior") && (
              <Link
                href={`/engagements/${engagement.id}/populations/new`}
                className="text-sm font-medium text-ledger-600 link"
              >
                Load a ledger
              </Link>
            )
          }
        >
          <PopulationList
            engagementId={engagement.id}
            populations={populations.filter((p) => !p.archivedAt)}
            currency={engagement.currency}
            mayLoad={hasAtLeastRole(role, "senior")}
          />
        </Card>
        <Card
          title="Samples"
          className="lg:col-span-3"
          action={
            hasAtLeastRole(role, "senior") && (
              <Link
                href={`/engagements/${engagement.id}/samples/new`}
                className="text-sm font-medium text-ledger-600 link"
              >
                Plan a sample
              </Link>
            )
          }
        >
          <SampleList
            engagementId={engagement.id}
            samples={samples}
            overviews={overviews}
            mayPlan={hasAtLeastRole(role, "senior")}
          />
        </Card>
      </div>
    </>
  );
}
