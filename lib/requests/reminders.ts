import "server-only";
import type { Knex } from "knex";
import { recordAudit } from "@/lib/data/audit-log";
import { listOverdueRequestItems, markRequestListRemindedById } from "@/lib/data/request-lists";
import { clientRequestUrl, teamRequestUrl } from "@/lib/mail/links";
import { sendMail, type MailResult } from "@/lib/mail/send";
import type { OverdueList } from "@/templates/email/client-requests";
import { utcDay } from "./status";

interface Claimed {
  id: number;
  engagementId: number;
  sampleId: number;
  title: string;
  dueDate: string;
  contact: Person;
  senior: Person;
  clientName: string;
  engagementName: string;
  itemRefs: string[];
}
interface Person {
  id: number;
  name: string;
  email: string;
}
/** Marks each list reminded today (so a second run the same day sends nothing) and logs it, in the caller's transaction. */
async function claim(trx: Knex.Transaction, today: string): Promise<Claimed[]> {
  const byList = new Map<number, Claimed>();
  for (const r of await listOverdueRequestItems(trx, { today })) {
    const list = byList.get(r.id) ?? {
      id: r.id,
      engagementId: r.engagement_id,
      sampleId: r.sample_id,
      title: r.title,
      dueDate: r.due_date,
      clientName: r.client_name,
      engagementName: r.ename,
      contact: { id: r.cid, name: r.cname, email: r.cemail },
      senior: { id: r.sactive ? r.sid : 0, name: r.sname, email: r.semail },
      itemRefs: [],
    };
    list.itemRefs.push(String(r.item_ref));
    byList.set(r.id, list);
  }
  const claimed: Claimed[] = [];
  for (const list of byList.values()) {
    if (!(await markRequestListRemindedById(trx, { listId: list.id, today }))) continue;
    claimed.push(list);
    await recordAudit(trx, {
      actorUserId: null,
      engagementId: list.engagementId,
      sampleId: list.sampleId,
      entity: "request_list",
      entityId: list.id,
      action: "overdue-reminder",
      after: {
        today,
        dueDate: list.dueDate,
        overdueItems: list.itemRefs,
        to: [list.contact.email, ...(list.senior.id ? [list.senior.email] : [])],
      },
    });
  }
  return claimed;
}

function digestBy(lists: Claimed[], who: (l: Claimed) => Person, url: (l: Claimed) => string) {
  const byPerson = new Map<number, { person: Person; lists: OverdueList[] }>();
  for (const l of lists) {
    const p = who(l);
    if (!p.id) continue;
    const entry = byPerson.get(p.id) ?? { person: p, lists: [] };
    entry.lists.push({
      title: l.title,
      dueDate: l.dueDate,
      itemRefs: l.itemRefs,
      url: url(l),
      engagement: { clientName: l.clientName, name: l.engagementName },
    });
    byPerson.set(p.id, entry);
  }
  return [...byPerson.values()];
}

/**
 * The daily job: one digest of overdue items to each client contact and one to each senior who
 * sent a list (see `npm run job:request-reminders`). `today` is a UTC day, YYYY-MM-DD.
 */
export async function runRequestReminders(
  db: Knex,
  { today = utcDay() }: { today?: string } = {},
): Promise<{ lists: number; messages: MailResult[] }> {
  // The digests are queued in the claim's own transaction: a list is marked reminded exactly when its messages are queued.
  return db.transaction(async (trx) => {
    const lists = await claim(trx, today);
    const sends = [
      ...digestBy(
        lists,
        (l) => l.contact,
        (l) => clientRequestUrl(l.id),
      ).map((d) => ({ ...d, audience: "client" as const })),
      ...digestBy(
        lists,
        (l) => l.senior,
        (l) => teamRequestUrl(l.engagementId, l.sampleId, l.id),
      ).map((d) => ({ ...d, audience: "team" as const })),
    ];
    const messages: MailResult[] = [];
    for (const d of sends)
      messages.push(
        await sendMail(trx, {
          to: d.person,
          template: "request-reminders",
          data: { recipient: { name: d.person.name }, audience: d.audience, lists: d.lists, today },
        }),
      );
    return { lists: lists.length, messages };
  });
}
