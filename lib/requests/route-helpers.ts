import "server-only";
import type { EngagementContext } from "@/lib/auth/with-role";
import { parseIdParam } from "@/lib/auth/access";
import { sampleOf } from "@/lib/samples/route-helpers";
import { getRequestListRow } from "./lists";

/** The request list named by the route's `listId`, on the route's sample and engagement (404 otherwise). */
export async function listOf(ctx: EngagementContext) {
  const sample = await sampleOf(ctx);
  return getRequestListRow(ctx.db, {
    engagementId: ctx.engagementId,
    sampleId: sample.id,
    listId: parseIdParam(ctx.params.listId, "request list"),
  });
}

/** A file of a request list as stored (404 when it is not on the list). */
export async function requestFileOf(
  ctx: { db: EngagementContext["db"]; params: Record<string, string> },
  listId: number,
) {
  const row = await ctx
    .db("request_files as f")
    .join("request_items as r", "r.id", "f.request_item_id")
    .where({ "f.id": parseIdParam(ctx.params.fileId, "file"), "r.request_list_id": listId })
    .first("f.*");
  if (!row) return null;
  return {
    objectKey: String(row.object_key),
    fileName: String(row.file_name),
    contentType: String(row.content_type),
    sizeBytes: Number(row.size_bytes),
    sha256: String(row.sha256),
    uploadedBy: Number(row.uploaded_by),
  };
}
