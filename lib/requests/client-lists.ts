import "server-only";
import type { Knex } from "knex";
import { listRequestListsByContactId } from "./lists";

/** The contact's lists as they see them: title, audit, due date, status and counts — nothing of the team. */
export async function listClientSummaries(db: Knex, { contactUserId }: { contactUserId: number }) {
  const lists = await listRequestListsByContactId(db, { contactUserId });
  const engagements = lists.length
    ? await db("engagements")
        .whereIn("id", [...new Set(lists.map((l) => l.engagementId))])
        .select("id", "client_name", "name")
    : [];
  return lists.map((l) => {
    const e = engagements.find((x) => Number(x.id) === l.engagementId);
    return {
      id: l.id,
      title: l.title,
      dueDate: l.dueDate,
      status: l.status,
      closedReason: l.closedReason,
      sentBy: l.createdByName,
      counts: l.counts,
      total: l.total,
      engagement: { clientName: String(e?.client_name ?? ""), name: String(e?.name ?? "") },
    };
  });
}

export type ClientListSummary = Awaited<ReturnType<typeof listClientSummaries>>[number];
