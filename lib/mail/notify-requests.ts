import "server-only";
import type { Knex } from "knex";
import { getEngagementById } from "@/lib/data/engagements";
import { getFirmNameById } from "@/lib/data/firms";
import { INVITATION_DAYS } from "@/lib/requests/invitations";
import type { RequestListRow } from "@/lib/data/request-lists";
import { appUrl, clientRequestUrl, invitationUrl } from "./links";
import { sendMail, type MailResult } from "./send";

// Every notice here is queued in the mail outbox inside its write's transaction (the caller passes it) and never throws (sendMail logs and reports).

async function engagementRef(db: Knex, engagementId: number) {
  const e = await getEngagementById(db, { engagementId });
  if (!e) throw new Error(`engagement ${engagementId} not found`);
  return { clientName: e.clientName, name: e.name };
}

async function safely(what: string, send: () => Promise<MailResult>): Promise<MailResult> {
  try {
    return await send();
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    console.error(`mail: ${what} not sent — ${reason}`);
    return { sent: false, to: what, reason };
  }
}

/** A new client contact gets the one-time link to choose a password; an existing one, the sign-in page. */
export function notifyClientInvitation(
  db: Knex,
  a: {
    engagementId: number;
    contact: { name: string; email: string };
    token: string | null;
    invitedBy: { name: string };
    firmId: number;
  },
) {
  return safely(`client-invitation to ${a.contact.email}`, async () => {
    const [engagement, firmName] = await Promise.all([
      engagementRef(db, a.engagementId),
      getFirmNameById(db, { firmId: a.firmId }),
    ]);
    return sendMail(db, {
      to: a.contact,
      template: "client-invitation",
      data: {
        recipient: { name: a.contact.name },
        invitedBy: a.invitedBy,
        firmName: firmName ?? "Your auditors",
        engagement,
        actionUrl: a.token ? invitationUrl(a.token) : appUrl("/sign-in"),
        needsPassword: Boolean(a.token),
        expiresInDays: INVITATION_DAYS,
      },
    });
  });
}

export function notifyRequestListSent(db: Knex, a: { list: RequestListRow; itemCount: number }) {
  return safely(`request-list-sent to ${a.list.contactEmail}`, async () =>
    sendMail(db, {
      to: { name: a.list.contactName, email: a.list.contactEmail },
      template: "request-list-sent",
      data: {
        recipient: { name: a.list.contactName },
        sentBy: { name: a.list.createdByName },
        engagement: await engagementRef(db, a.list.engagementId),
        title: a.list.title,
        itemCount: a.itemCount,
        dueDate: a.list.dueDate,
        message: a.list.message,
        listUrl: clientRequestUrl(a.list.id),
      },
    }),
  );
}

export function notifyRequestFileReturned(
  db: Knex,
  a: { list: RequestListRow; returnedBy: { name: string }; itemRef: string; fileName: string; reason: string },
) {
  return safely(`request-file-returned to ${a.list.contactEmail}`, async () =>
    sendMail(db, {
      to: { name: a.list.contactName, email: a.list.contactEmail },
      template: "request-file-returned",
      data: {
        recipient: { name: a.list.contactName },
        returnedBy: a.returnedBy,
        engagement: await engagementRef(db, a.list.engagementId),
        title: a.list.title,
        itemRef: a.itemRef,
        fileName: a.fileName,
        reason: a.reason,
        listUrl: clientRequestUrl(a.list.id),
      },
    }),
  );
}

/** The contact of a list closed by the lock of its sample is told it takes no more files. */
export function notifyRequestListClosed(db: Knex, a: { list: RequestListRow; reason: string }) {
  return safely(`request-list-closed to ${a.list.contactEmail}`, async () =>
    sendMail(db, {
      to: { name: a.list.contactName, email: a.list.contactEmail },
      template: "request-list-closed",
      data: {
        recipient: { name: a.list.contactName },
        engagement: await engagementRef(db, a.list.engagementId),
        title: a.list.title,
        reason: a.reason,
        listUrl: clientRequestUrl(a.list.id),
      },
    }),
  );
}
