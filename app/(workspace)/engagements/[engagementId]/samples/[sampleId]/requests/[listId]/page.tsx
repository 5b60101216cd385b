import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { loadTeamRequestListPage } from "@/lib/views/request-pages";
import { PageHeader } from "@/components/ui/page-header";
import { Badge } from "@/components/ui/badge";
import { TeamRequestList } from "@/components/requests/team-request-list";
import { formatDate } from "@/lib/format/date";

export const metadata: Metadata = { title: "Request list" };

export default async function TeamRequestListPage({
  params,
}: {
  params: Promise<{ engagementId: string; sampleId: string; listId: string }>;
}) {
  const { engagementId, sampleId, listId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { sample, review, view } = await loadTeamRequestListPage(engagement.id, sampleId, listId);
  const { list } = view;
  const mayDecide = hasAtLeastRole(role, "staff") && list.status === "open" && !review.lock;
  return (
    <>
      <PageHeader
        eyebrow={engagement.clientName}
        title={list.title}
        actions={list.status === "closed" ? <Badge>Closed</Badge> : <Badge tone="blue">Open</Badge>}
      >
        <Link href={`/engagements/${engagement.id}/samples/${sample.id}`} className="link">
          {sample.name}
        </Link>
        {` · to ${list.contactName} (${list.contactEmail}) · due ${formatDate(list.dueDate)} · book values ${list.showBookValues ? "shown to the client" : "hidden from the client"} · sent by ${list.createdByName}`}
      </PageHeader>
      <TeamRequestList
        engagementId={engagement.id}
        sampleId={sample.id}
        initial={view}
        mayDecide={mayDecide}
        currency={engagement.currency}
      />
    </>
  );
}
