// The messages of client requests: the invitation of a client contact, a new request list, a file
// sent back, and the daily digests of overdue items (to the client contact and to the senior).
import { renderEmail } from "./layout";
import { engagementLabel, type EngagementRef, type Person, type RenderedEmail } from "./types";
import { formatDate } from "@/lib/format/date";

export interface ClientInvitationData {
  recipient: Person;
  invitedBy: Person;
  firmName: string;
  engagement: EngagementRef;
  /** The one-time link to choose a password, or the sign-in page for someone who has an account. */
  actionUrl: string;
  needsPassword: boolean;
  expiresInDays: number;
}

export function clientInvitation(d: ClientInvitationData): RenderedEmail {
  return renderEmail({
    subject: `${d.firmName} invites you to share audit evidence (${d.engagement.clientName})`,
    preview: `${d.invitedBy.name} will ask you for documents through Sondage.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: `${d.invitedBy.name} of ${d.firmName} invited you to Sondage for the audit "${d.engagement.name}" of ${d.engagement.clientName}. The audit team will send you lists of items for which they need documents; you upload them there and follow each item's status.`,
      },
      {
        kind: "facts",
        rows: [
          ["Audit", engagementLabel(d.engagement)],
          ["Invited by", d.invitedBy.name],
        ],
      },
      {
        kind: "paragraph",
        text: d.needsPassword
          ? `Choose your password with the link below. It works once and for ${d.expiresInDays} days.`
          : "Sign in with your existing Sondage account.",
      },
    ],
    action: { label: d.needsPassword ? "Choose your password" : "Sign in", url: d.actionUrl },
    judgementCaution: false,
    footer: `You receive this because ${d.invitedBy.name} invited you. If you do not expect it, ignore this message: nothing happens without the link.`,
  });
}

export interface RequestListSentData {
  recipient: Person;
  sentBy: Person;
  engagement: EngagementRef;
  title: string;
  itemCount: number;
  dueDate: string;
  message: string | null;
  listUrl: string;
}

export function requestListSent(d: RequestListSentData): RenderedEmail {
  return renderEmail({
    subject: `Documents requested: ${d.title} — due ${formatDate(d.dueDate, "dueDate")}`,
    preview: `${d.sentBy.name} asks for documents on ${d.itemCount} item${d.itemCount === 1 ? "" : "s"}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: `${d.sentBy.name} asks you for documents on ${d.itemCount} item${d.itemCount === 1 ? "" : "s"} for the audit of ${d.engagement.clientName}.`,
      },
      {
        kind: "facts",
        rows: [
          ["Request list", d.title],
          ["Items", String(d.itemCount)],
          ["Due by", formatDate(d.dueDate, "dueDate")],
          ["From", d.sentBy.name],
        ],
      },
      ...(d.message ? [{ kind: "quote" as const, label: `Message from ${d.sentBy.name}`, text: d.message }] : []),
    ],
    action: { label: "Open the request list", url: d.listUrl },
    judgementCaution: false,
    footer: `You receive this because you are a client contact for ${engagementLabel(d.engagement)} in Sondage.`,
  });
}

export interface RequestFileReturnedData {
  recipient: Person;
  returnedBy: Person;
  engagement: EngagementRef;
  title: string;
  itemRef: string;
  fileName: string;
  reason: string;
  listUrl: string;
}

export function requestFileReturned(d: RequestFileReturnedData): RenderedEmail {
  return renderEmail({
    subject: `More needed for ${d.itemRef} (${d.title})`,
    preview: `${d.returnedBy.name} sent back ${d.fileName}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: `${d.returnedBy.name} looked at "${d.fileName}" for item ${d.itemRef} and needs something more.`,
      },
      { kind: "quote", label: "What is needed", text: d.reason },
      {
        kind: "facts",
        rows: [
          ["Request list", d.title],
          ["Item", d.itemRef],
          ["File sent back", d.fileName],
        ],
      },
    ],
    action: { label: "Upload what is needed", url: d.listUrl },
    judgementCaution: false,
    footer: `You receive this because you are a client contact for ${engagementLabel(d.engagement)} in Sondage.`,
  });
}

export interface OverdueList {
  title: string;
  dueDate: string;
  itemRefs: string[];
  url: string;
  engagement: EngagementRef;
}

export interface RequestRemindersData {
  recipient: Person;
  audience: "client" | "team";
  lists: OverdueList[];
  today: string;
}

const listedRefs = (refs: string[]) =>
  refs.length <= 12 ? refs.join(", ") : `${refs.slice(0, 12).join(", ")} and ${refs.length - 12} more`;

/** The daily digest of overdue items: one message per person, one block per list. */
export function requestReminders(d: RequestRemindersData): RenderedEmail {
  const total = d.lists.reduce((n, l) => n + l.itemRefs.length, 0);
  const client = d.audience === "client";
  return renderEmail({
    subject: client
      ? `Reminder: ${total} requested item${total === 1 ? "" : "s"} overdue`
      : `Client requests overdue: ${total} item${total === 1 ? "" : "s"}`,
    preview: `${total} item${total === 1 ? "" : "s"} past the due date on ${d.lists.length} request list${d.lists.length === 1 ? "" : "s"}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: client
          ? `These requested documents are past their due date (as of ${formatDate(d.today, "today")}). Please upload them, or add a note on the item if they cannot be found.`
          : `The client has not yet provided these items, past the due date (as of ${formatDate(d.today, "today")}).`,
      },
      ...d.lists.map((l) => ({
        kind: "facts" as const,
        rows: [
          ["Request list", l.title],
          ["Audit", engagementLabel(l.engagement)],
          ["Was due", formatDate(l.dueDate, "dueDate")],
          ["Items", listedRefs(l.itemRefs)],
          ["Open", l.url],
        ] as [string, string][],
      })),
    ],
    action: { label: client ? "Open my requests" : "Open the request list", url: d.lists[0].url },
    judgementCaution: false,
    footer: client
      ? "You receive this daily while requested items are overdue."
      : "You receive this daily while items on a request list you sent are overdue.",
  });
}

export interface RequestListClosedData {
  recipient: Person;
  engagement: EngagementRef;
  title: string;
  reason: string;
  listUrl: string;
}

/** The client contact is told that a list no longer takes files (the audit team locked the sample). */
export function requestListClosed(d: RequestListClosedData): RenderedEmail {
  return renderEmail({
    subject: `Request list closed: ${d.title}`,
    preview: "The audit team no longer takes files on this list.",
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: `The request list "${d.title}" for the audit of ${d.engagement.clientName} is closed: the audit team has finished the work it was for and no longer takes files on it. You can still open it to see what you sent.`,
      },
      {
        kind: "facts",
        rows: [
          ["Request list", d.title],
          ["Why it closed", d.reason.replace(/\.$/, "")],
        ],
      },
      { kind: "paragraph", text: "If you have more to send, contact the audit team directly." },
    ],
    action: { label: "Open the request list", url: d.listUrl },
    judgementCaution: false,
    footer: `You receive this because you are a client contact for ${engagementLabel(d.engagement)} in Sondage.`,
  });
}
