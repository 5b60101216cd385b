import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db/knex";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { getRequestListById } from "@/lib/data/request-lists";
import { teamListView } from "@/lib/requests/views";
import { getReviewState } from "@/lib/review/review-state";
import { getSampleById } from "@/lib/data/samples";
import { PageHeader } from "@/components/ui/page-header";
import { Badge } from "@/components/ui/badge";
import { TeamRequestList } from "@/components/requests/team-request-list";
import { formatDate } from "@/lib/format/date";

export const metadata: Metadata = { title: "Request list" };

async function load(engagementId: number, sampleIdParam: string, listIdParam: string) {
  const [sampleId, listId] = [Number(sampleIdParam), Number(listIdParam)];
  if (![sampleId, listId].every((n) => Number.isSafeInteger(n) && n > 0)) notFound();
  const db = getDb();
  try {
    const sample = await getSampleById(db, { engagementId, sampleId });
    const [list, review] = await Promise.all([
      getRequestListById(db, { engagementId, sampleId, listId }),
      getReviewState(db, { sampleId }),
    ]);
    return { sample, review, view: await teamListView(db, list) };
  } catch (err) {
    if (err instanceof AppError && err.status === 404) notFound();
    throw err;
  }
}

export default async function TeamRequestListPage({
  params,
}: {
  params: Promise<{ engagementId: string; sampleId: string; listId: string }>;
}) {
  const { engagementId, sampleId, listId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { sample, review, view } = await load(engagement.id, sampleId, listId);
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
