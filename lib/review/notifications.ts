import "server-only";
import type { Knex } from "knex";
import { notifyReviewNote, notifySampleLocked, notifySampleReadyForReview } from "@/lib/mail/notify";
import { getEngagementById } from "@/lib/data/engagements";
import { listActiveMemberContactsByEngagementId } from "@/lib/data/members";
import { getNoteWithRaiserById } from "@/lib/data/review-notes";
import type { SampleRecord } from "@/lib/data/samples";
import type { EngagementRole } from "@/lib/auth/roles";

// Mail is queued in the outbox inside the change's transaction (the route passes it) and sent by the outbox worker; a message that cannot be rendered never undoes the change.

const teamWithRoles = (db: Knex, engagementId: number, roles: EngagementRole[]) =>
  listActiveMemberContactsByEngagementId(db, { engagementId, roles });

async function base(db: Knex, sample: SampleRecord, actor: { name: string; email: string }) {
  const engagement = (await getEngagementById(db, { engagementId: sample.engagementId }))!;
  return {
    actor,
    engagement: { id: engagement.id, clientName: engagement.clientName, name: engagement.name },
    sample: { id: sample.id, name: sample.name },
  };
}

export async function notifyReadyForReview(
  db: Knex,
  { sample, preparer }: { sample: SampleRecord; preparer: { name: string; email: string } },
) {
  await notifySampleReadyForReview(db, {
    ...(await base(db, sample, preparer)),
    recipients: await teamWithRoles(db, sample.engagementId, ["manager", "partner"]),
  });
}

export async function notifyNote(
  db: Knex,
  {
    sample,
    noteId,
    kind,
    actor,
  }: {
    sample: SampleRecord;
    noteId: number;
    kind: "raised" | "answered" | "cleared";
    actor: { name: string; email: string };
  },
) {
  const note = await getNoteWithRaiserById(db, { noteId });
  const common = await base(db, sample, actor);
  if (kind === "answered") {
    await notifyReviewNote(db, "answered", {
      ...common,
      recipients: [{ name: note.name, email: note.email }],
      note: { text: note.text },
      answer: { text: note.answer ?? "" },
    });
  } else {
    await notifyReviewNote(db, kind, {
      ...common,
      recipients: await teamWithRoles(db, sample.engagementId, ["staff", "senior"]),
      note: { text: note.text },
    });
  }
}

export async function notifyLocked(
  db: Knex,
  { sample, actor }: { sample: SampleRecord; actor: { name: string; email: string } },
) {
  await notifySampleLocked(db, {
    ...(await base(db, sample, actor)),
    recipients: await teamWithRoles(db, sample.engagementId, ["staff", "senior", "manager", "partner"]),
  });
}
