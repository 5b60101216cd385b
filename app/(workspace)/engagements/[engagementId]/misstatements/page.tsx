import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { loadMisstatementsPage } from "@/lib/views/engagement-pages";
import { PageHeader } from "@/components/ui/page-header";
import { Card } from "@/components/ui/card";
import { buttonClass } from "@/components/ui/button";
import { EngagementTabs } from "@/components/engagements/engagement-tabs";
import { StatusCard } from "@/components/misstatements/status-card";
import { TotalsCard } from "@/components/misstatements/totals-card";
import { BuildUpChart } from "@/components/misstatements/build-up-chart";
import { RowsTable } from "@/components/misstatements/rows-table";
import { EntryForm } from "@/components/misstatements/entry-form";
import { SettingsForm } from "@/components/misstatements/settings-form";
import { SummaryReview } from "@/components/misstatements/summary-review";
import { TrailCard } from "@/components/misstatements/trail-card";

export const metadata: Metadata = { title: "Summary of misstatements" };

export default async function MisstatementsPage({ params }: { params: Promise<{ engagementId: string }> }) {
  const { engagementId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const view = await loadMisstatementsPage(engagement.id);
  const locked = view.review.lock !== null;
  const mayEdit = hasAtLeastRole(role, "staff") && !locked;
  const api = `/api/engagements/${engagement.id}/misstatements`;
  return (
    <>
      <PageHeader
        eyebrow={engagement.clientName}
        title="Summary of misstatements"
        actions={
          <>
            <a href={`${api}/workbook`} className={buttonClass("secondary")}>
              Export workbook (.xlsx)
            </a>
            <a href={`${api}/workpaper`} className={buttonClass("secondary")}>
              {locked ? "Workpaper (PDF)" : "Draft workpaper (PDF)"}
            </a>
          </>
        }
      >
        <Link href={`/engagements/${engagement.id}`} className="hover:underline">
          {engagement.name}
        </Link>{" "}
        · every sample&apos;s result and the team&apos;s entries, against materiality (AU-C 450 / ISA 450; AS 2810)
      </PageHeader>
      <EngagementTabs engagementId={engagement.id} current="misstatements" />
      <div className="grid gap-6">
        <div className="grid gap-6 lg:grid-cols-2">
          <StatusCard view={view} />
          <Card title="Build-up against materiality">
            <BuildUpChart view={view} />
          </Card>
        </div>
        <TotalsCard view={view} />
        <Card title="Schedule">
          <ul className="mb-4 list-disc space-y-1 pl-5 text-xs text-ink-soft">
            {view.conventions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
          <RowsTable view={view} mayEdit={mayEdit} />
        </Card>
        <Card title="Samples feeding the summary">
          <ul className="divide-y divide-ink-line/60 text-sm">
            {view.samples.length === 0 && <li className="py-2 text-ink-soft">No samples planned yet.</li>}
            {view.samples.map((s) => (
              <li key={s.sampleId} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
                <Link href={s.link} className="font-medium text-ledger-700 underline">
                  {s.reference} · {s.name}
                </Link>
                <span className="text-ink-soft">
                  {s.state === "contributes"
                    ? s.locked
                      ? s.frozen
                        ? "Locked — row frozen at lock"
                        : "Locked"
                      : "Live — results still open"
                    : s.reason}
                </span>
              </li>
            ))}
          </ul>
        </Card>
        {mayEdit && (
          <Card title="Add a misstatement found outside sampling">
            <EntryForm engagementId={engagement.id} />
          </Card>
        )}
        {!locked && hasAtLeastRole(role, "manager") && (
          <Card title="Thresholds">
            <SettingsForm engagementId={engagement.id} materiality={view.materiality} />
          </Card>
        )}
        <SummaryReview view={view} role={role} />
        <TrailCard view={view} />
      </div>
    </>
  );
}
