import "server-only";
import type { Knex } from "knex";
import type { EmailTemplateData, EmailTemplateName, SampleEventData } from "@/templates/email";
import { sampleUrl } from "./links";
import { sendMail, type MailResult, type Recipient } from "./send";

/** What the samples and review code hands over, with the transaction of its change. */
export interface SampleNotice {
  recipients: Recipient[];
  /** Who acted; given an e-mail, they get no message about their own action. */
  actor: { name: string; email?: string };
  engagement: { id: number; clientName: string; name: string };
  sample: { id: number; name: string };
  /** Defaults to now. */
  at?: Date | string;
  /** Defaults to the sample's page, /engagements/<id>/samples/<sampleId>. */
  sampleUrl?: string;
}

export interface ReviewNoteNotice extends SampleNotice {
  note: { text: string };
}
export interface ReviewNoteAnsweredNotice extends ReviewNoteNotice {
  answer: { text: string };
}

type SampleTemplate = Exclude<
  EmailTemplateName,
  "engagement-invitation" | "client-invitation" | "request-list-sent" | "request-file-returned" | "request-reminders"
>;

/** Each recipient once, never the actor. */
function audience(notice: SampleNotice): Recipient[] {
  const seen = new Set<string>(notice.actor.email ? [notice.actor.email.toLowerCase()] : []);
  return notice.recipients.filter((r) => {
    const key = r.email.toLowerCase();
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

function refuse(template: SampleTemplate, notice: SampleNotice, reason: string): MailResult[] {
  console.error(`mail: ${template} not sent — ${reason}`);
  return audience(notice).map((r) => ({ sent: false, to: r.email, reason }));
}

async function notifyEach<K extends SampleTemplate>(
  db: Knex,
  template: K,
  notice: SampleNotice,
  dataFor: (event: SampleEventData) => EmailTemplateData[K],
): Promise<MailResult[]> {
  let link: string;
  try {
    link = notice.sampleUrl ?? sampleUrl(notice.engagement.id, notice.sample.id);
  } catch (err) {
    return refuse(template, notice, err instanceof Error ? err.message : String(err));
  }
  const event: Omit<SampleEventData, "recipient"> = {
    actor: { name: notice.actor.name },
    engagement: { clientName: notice.engagement.clientName, name: notice.engagement.name },
    sample: { name: notice.sample.name },
    sampleUrl: link,
    at: notice.at ?? new Date(),
  };
  return Promise.all(
    audience(notice).map((to) =>
      sendMail(db, { to, template, data: dataFor({ ...event, recipient: { name: to.name } }) }),
    ),
  );
}

/** The preparer sent a sample for review: tell its reviewers. */
export function notifySampleReadyForReview(db: Knex, notice: SampleNotice): Promise<MailResult[]> {
  return notifyEach(db, "sample-ready-for-review", notice, (event) => event);
}

/** A review note was raised, answered (with the answer's text) or cleared. */
export function notifyReviewNote(db: Knex, kind: "raised" | "cleared", notice: ReviewNoteNotice): Promise<MailResult[]>;
export function notifyReviewNote(db: Knex, kind: "answered", notice: ReviewNoteAnsweredNotice): Promise<MailResult[]>;
export function notifyReviewNote(
  db: Knex,
  kind: "raised" | "answered" | "cleared",
  notice: ReviewNoteNotice | ReviewNoteAnsweredNotice,
): Promise<MailResult[]> {
  if (kind === "answered") {
    if (!("answer" in notice))
      return Promise.resolve(
        refuse("review-note-answered", notice, "answer: an answered review note needs the answer's text"),
      );
    return notifyEach(db, "review-note-answered", notice, (event) => ({
      ...event,
      note: notice.note,
      answer: notice.answer,
    }));
  }
  return notifyEach(db, `review-note-${kind}`, notice, (event) => ({ ...event, note: notice.note }));
}

/** A manager or partner locked a sample: tell its team. */
export function notifySampleLocked(db: Knex, notice: SampleNotice): Promise<MailResult[]> {
  return notifyEach(db, "sample-locked", notice, (event) => event);
}
