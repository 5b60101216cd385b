import "server-only";
import type { EngagementContext } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { sampleOf } from "@/lib/samples/route-helpers";
import { getRequestFileById, type RequestFileRecord } from "@/lib/data/request-items";
import { getRequestListById } from "@/lib/data/request-lists";

/** The request list named by the route's `listId`, on the route's sample and engagement (404 otherwise). */
export async function listOf(ctx: EngagementContext) {
  const sample = await sampleOf(ctx);
  return getRequestListById(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    listId: parseIdParam(ctx.params.listId, "request list"),
  });
}

/** A file of a request list as stored (null when it is not on the list). */
export function requestFileOf(
  ctx: { db: EngagementContext["db"]; params: Record<string, string> },
  listId: number,
): Promise<RequestFileRecord | null> {
  return getRequestFileById(ctx.db, { listId, fileId: parseIdParam(ctx.params.fileId, "file") });
}
