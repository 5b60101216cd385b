// Every e-mail Sondage sends, by name: each is a pure function from typed data to { subject, text, html }.
import { engagementInvitation, type EngagementInvitationData } from "./engagement-invitation";
import { reviewNoteAnswered, type ReviewNoteAnsweredData } from "./review-note-answered";
import { reviewNoteCleared, type ReviewNoteClearedData } from "./review-note-cleared";
import { reviewNoteRaised, type ReviewNoteRaisedData } from "./review-note-raised";
import { sampleLocked, type SampleLockedData } from "./sample-locked";
import { sampleReadyForReview, type SampleReadyForReviewData } from "./sample-ready-for-review";
import {
  clientInvitation,
  requestFileReturned,
  requestListSent,
  requestReminders,
  type ClientInvitationData,
  type RequestFileReturnedData,
  type RequestListSentData,
  type RequestRemindersData,
} from "./client-requests";
import { requestListClosed, type RequestListClosedData } from "./client-requests";
import { staffInvitation, type StaffInvitationData } from "./staff-invitation";
import type { RenderedEmail } from "./types";

export interface EmailTemplateData {
  "engagement-invitation": EngagementInvitationData;
  "sample-ready-for-review": SampleReadyForReviewData;
  "review-note-raised": ReviewNoteRaisedData;
  "review-note-answered": ReviewNoteAnsweredData;
  "review-note-cleared": ReviewNoteClearedData;
  "sample-locked": SampleLockedData;
  "client-invitation": ClientInvitationData;
  "request-list-sent": RequestListSentData;
  "request-file-returned": RequestFileReturnedData;
  "request-reminders": RequestRemindersData;
  "request-list-closed": RequestListClosedData;
  "staff-invitation": StaffInvitationData;
}

export type EmailTemplateName = keyof EmailTemplateData;

export const EMAIL_TEMPLATES: { [K in EmailTemplateName]: (data: EmailTemplateData[K]) => RenderedEmail } = {
  "engagement-invitation": engagementInvitation,
  "sample-ready-for-review": sampleReadyForReview,
  "review-note-raised": reviewNoteRaised,
  "review-note-answered": reviewNoteAnswered,
  "review-note-cleared": reviewNoteCleared,
  "sample-locked": sampleLocked,
  "client-invitation": clientInvitation,
  "request-list-sent": requestListSent,
  "request-file-returned": requestFileReturned,
  "request-reminders": requestReminders,
  "request-list-closed": requestListClosed,
  "staff-invitation": staffInvitation,
};

export function renderEmailTemplate<K extends EmailTemplateName>(name: K, data: EmailTemplateData[K]): RenderedEmail {
  return EMAIL_TEMPLATES[name](data);
}

export type { RenderedEmail, Person, EngagementRef, SampleRef, SampleEventData } from "./types";
