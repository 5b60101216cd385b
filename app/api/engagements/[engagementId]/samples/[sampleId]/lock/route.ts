import { z } from "zod";
import { withEngagementRole } from "@/lib/auth/with-role";
import { lockSample } from "@/lib/review/lock";
import { notifyRequestListClosed } from "@/lib/mail/notify-requests";
import { getRequestListById } from "@/lib/data/request-lists";
import { CLOSED_BY_LOCK } from "@/lib/requests/lists";
import { notifyLocked } from "@/lib/review/notifications";
import { getReviewState } from "@/lib/review/review-state";
import { sampleOf } from "@/lib/samples/route-helpers";
import { assembleWorkpaper } from "@/lib/workpaper/assemble";
import { renderWorkpaper } from "@/templates/workpaper/render-workpaper";

export const maxDuration = 120;

export const POST = withEngagementRole(z.object({}), "manager", async (_input, ctx) => {
  const sample = await sampleOf(ctx);
  const locked = await lockSample(ctx.db, {
    sample,
    actorId: ctx.user.id,
    role: ctx.role,
    render: async (lock) =>
      renderWorkpaper(
        await assembleWorkpaper(ctx.db, {
          engagementId: ctx.engagementId,
          sampleId: sample.id,
          draft: false,
          lock: { lockedByName: ctx.user.name, role: lock.role, lockedAt: lock.lockedAt, reference: lock.reference },
        }),
      ),
    // The team's notice and each closed list's notice to its contact are queued in the lock's own transaction.
    inTransaction: async (trx, closedListIds) => {
      await notifyLocked(trx, { sample, actor: ctx.user });
      for (const listId of closedListIds) {
        const list = await getRequestListById(trx, { engagementId: ctx.engagementId, sampleId: sample.id, listId });
        await notifyRequestListClosed(trx, { list, reason: CLOSED_BY_LOCK });
      }
    },
  });
  return { locked, review: await getReviewState(ctx.db, { sampleId: sample.id }) };
});
