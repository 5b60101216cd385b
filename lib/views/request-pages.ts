import "server-only";
import { cache } from "react";
import { notFound } from "next/navigation";
import { getDb } from "@/db/knex";
import { getContactRequestListById, getRequestListById } from "@/lib/data/request-lists";
import { getSampleById } from "@/lib/data/samples";
import { listClientSummaries } from "@/lib/requests/client-lists";
import { getInvitationByToken } from "@/lib/requests/invitations";
import { clientListView, teamListView } from "@/lib/requests/views";
import { getReviewState } from "@/lib/review/review-state";
import { orNotFound, pageIdOrNotFound } from "./sample-page";

/** The choose-a-password page: whom the link is for, or null when it is not valid any more. */
export const loadInvitationPage = cache((token: string) => getInvitationByToken(getDb(), { token }));

/** A request list as the audit team sees it, with its sample and the sample's review state; not-found when not on this sample. */
export const loadTeamRequestListPage = cache(
  async (engagementId: number, sampleIdParam: string, listIdParam: string) => {
    const [sampleId, listId] = [pageIdOrNotFound(sampleIdParam), pageIdOrNotFound(listIdParam)];
    const db = getDb();
    return orNotFound(async () => {
      const sample = await getSampleById(db, { engagementId, sampleId });
      const [list, review] = await Promise.all([
        getRequestListById(db, { engagementId, sampleId, listId }),
        getReviewState(db, { sampleId }),
      ]);
      return { sample, review, view: await teamListView(db, list) };
    });
  },
);

/** The client contact's lists, as they see them. */
export const loadClientRequestsPage = cache((contactUserId: number) => listClientSummaries(getDb(), { contactUserId }));

/** One list as its client contact sees it; not-found when it is not theirs. */
export const loadClientRequestListPage = cache(async (contactUserId: number, listIdParam: string) => {
  const listId = pageIdOrNotFound(listIdParam);
  const db = getDb();
  const list = await getContactRequestListById(db, { listId, contactUserId });
  if (!list) notFound();
  return clientListView(db, list);
});
