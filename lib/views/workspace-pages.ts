import "server-only";
import { cache } from "react";
import { getDb } from "@/db/knex";
import { getMethodologyByFirmId, listMethodologyChangesByFirmId } from "@/lib/data/firm-methodology";
import { listUsersByFirmId } from "@/lib/data/users";
import { getInboxByUserId } from "@/lib/review/inbox";

/** The user's review inbox: the workspace layout counts it and the inbox page lists it, one read per request. */
export const loadInboxPage = cache((userId: number) => getInboxByUserId(getDb(), { userId }));

/** The firm's methodology settings and every saved change. */
export const loadMethodologyPage = cache(async (firmId: number) => {
  const db = getDb();
  const [current, changes] = await Promise.all([
    getMethodologyByFirmId(db, { firmId }),
    listMethodologyChangesByFirmId(db, { firmId }),
  ]);
  return { current, changes };
});

/** The firm's people. */
export const loadUsersPage = cache((firmId: number) => listUsersByFirmId(getDb(), { firmId }));
