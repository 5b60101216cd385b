import "server-only";
import type { Knex } from "knex";
import { listEngagementNamesByIds } from "@/lib/data/engagements";
import { listRequestListsByContactId } from "@/lib/data/request-lists";

/** The contact's lists as they see them: title, audit, due date, status and counts — nothing of the team. */
export async function listClientSummaries(db: Knex, { contactUserId }: { contactUserId: number }) {
  const lists = await listRequestListsByContactId(db, { contactUserId });
  const engagements = await listEngagementNamesByIds(db, {
    engagementIds: [...new Set(lists.map((l) => l.engagementId))],
  });
  return lists.map((l) => {
    const e = engagements.find((x) => x.id === l.engagementId);
    return {
      id: l.id,
      title: l.title,
      dueDate: l.dueDate,
      status: l.status,
      closedReason: l.closedReason,
      sentBy: l.createdByName,
      counts: l.counts,
      total: l.total,
      engagement: { clientName: e?.clientName ?? "", name: e?.name ?? "" },
    };
  });
}

export type ClientListSummary = Awaited<ReturnType<typeof listClientSummaries>>[number];
