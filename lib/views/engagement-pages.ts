import "server-only";
import { cache } from "react";
import { getDb } from "@/db/knex";
import { listMembersByEngagementId } from "@/lib/data/members";
import { getPopulationById, listPopulationsByEngagementId } from "@/lib/data/populations";
import { getPopulationProfile } from "@/lib/data/population-items";
import { listSamplesByEngagementId } from "@/lib/data/samples";
import { loadSummaryView } from "@/lib/misstatements/summary-view";
import { listSampleOverviews } from "@/lib/samples/overview";
import { orNotFound, pageIdOrNotFound } from "./sample-page";

/** The engagement overview: the team, the populations, the samples and each sample's standing. */
export const loadEngagementOverview = cache(async (engagementId: number) => {
  const db = getDb();
  const [members, populations, samples] = await Promise.all([
    listMembersByEngagementId(db, { engagementId }),
    listPopulationsByEngagementId(db, { engagementId }),
    listSamplesByEngagementId(db, { engagementId }),
  ]);
  const overviews = await listSampleOverviews(db, { engagementId, samples });
  return { members, populations, samples, overviews };
});

/** The team page: the engagement's audit team. */
export const loadTeamPage = cache((engagementId: number) => listMembersByEngagementId(getDb(), { engagementId }));

/** The summary of misstatements, as the page, the API and the PDF print it. */
export const loadMisstatementsPage = cache((engagementId: number) => loadSummaryView(getDb(), { engagementId }));

/** A population's page: the population, its profile, the engagement's other populations and its samples; not-found when not on this engagement. */
export const loadPopulationPage = cache(async (engagementId: number, populationIdParam: string) => {
  const populationId = pageIdOrNotFound(populationIdParam);
  const db = getDb();
  return orNotFound(async () => {
    const [population, profile, all, samples] = await Promise.all([
      getPopulationById(db, { engagementId, populationId }),
      getPopulationProfile(db, { populationId }),
      listPopulationsByEngagementId(db, { engagementId }),
      listSamplesByEngagementId(db, { engagementId }),
    ]);
    return { population, profile, all, samples };
  });
});
