import type { Knex } from "knex";

export interface Ack {
  itemId: number;
  version: number;
  value: string;
}
export interface SaveLedger {
  acks: Ack[];
  conflicts: number;
  unavailable: number;
  other: Record<string, number>;
}

/** Shared between connections: the newest version each item is known to have, and what happened. */
export class SaveTracker {
  readonly known = new Map<number, number>();
  readonly ledger: SaveLedger = { acks: [], conflicts: 0, unavailable: 0, other: {} };
  private counter = 0;

  constructor(items: { id: number; version: number }[]) {
    for (const it of items) this.known.set(it.id, it.version);
  }

  /** A save of the next unique value on a random item, at the version last seen. */
  next(): { itemId: number; body: string; value: string } {
    const ids = [...this.known.keys()];
    const itemId = ids[Math.floor(Math.random() * ids.length)];
    const n = ++this.counter;
    const value = `${1000 + Math.floor(n / 100)}.${String(n % 100).padStart(2, "0")}`;
    return {
      itemId,
      value,
      body: JSON.stringify({
        version: this.known.get(itemId),
        status: "done",
        auditedValue: value,
        comment: `load save ${n}`,
      }),
    };
  }

  answer(status: number, body: string, sent: { itemId: number; value: string }): void {
    if (status === 200) {
      const version = Number(JSON.parse(body).item.version);
      this.ledger.acks.push({ itemId: sent.itemId, version, value: sent.value });
      if (version > (this.known.get(sent.itemId) ?? 0)) this.known.set(sent.itemId, version);
    } else if (status === 409) this.ledger.conflicts++;
    else if (status === 503) this.ledger.unavailable++;
    else this.ledger.other[status] = (this.ledger.other[status] ?? 0) + 1;
  }
}

/** `unacknowledgedCommits`: saves the database committed whose answer never reached the caller (the connection died after COMMIT) — not lost, just unconfirmed. */
export interface Verification {
  acked: number;
  lost: number;
  duplicateVersions: number;
  wrongFinal: number;
  unacknowledgedCommits: number;
  auditRows: number;
}

/**
 * Every acknowledged save must be in the database: its value in the item's audit trail at its
 * version, no two acknowledgements of one item share a version (that would be a lost update the
 * 409 check let through), and each item's final value is the newest acknowledgement's.
 */
export async function verifySaves(
  db: Knex,
  { sampleId, initial, acks }: { sampleId: number; initial: Map<number, number>; acks: Ack[] },
): Promise<Verification> {
  const rows = await db("sample_items")
    .whereIn("id", [...initial.keys()])
    .select("id", "version", "audited_value");
  const audits = await db("audit_log")
    .where({ sample_id: sampleId, entity: "sample_item", action: "record-result" })
    .select("entity_id", "after_json");
  const audited = new Set(
    audits.map((a) => {
      const after = typeof a.after_json === "string" ? JSON.parse(a.after_json) : a.after_json;
      return `${a.entity_id}:${after.auditedValue}`;
    }),
  );
  const byItem = new Map<number, Ack[]>();
  for (const ack of acks) byItem.set(ack.itemId, [...(byItem.get(ack.itemId) ?? []), ack]);
  let lost = 0,
    duplicateVersions = 0,
    wrongFinal = 0,
    unacknowledgedCommits = 0;
  for (const ack of acks) if (!audited.has(`${ack.itemId}:${ack.value}`)) lost++;
  for (const row of rows) {
    const list = (byItem.get(Number(row.id)) ?? []).sort((x, y) => x.version - y.version);
    duplicateVersions += list.length - new Set(list.map((a) => a.version)).size;
    const expectedVersion = (initial.get(Number(row.id)) ?? 0) + list.length;
    const version = Number(row.version);
    if (version < expectedVersion) wrongFinal++;
    else if (version > expectedVersion) unacknowledgedCommits += version - expectedVersion;
    else if (list.length > 0 && row.audited_value !== list.at(-1)!.value) wrongFinal++;
  }
  return { acked: acks.length, lost, duplicateVersions, wrongFinal, unacknowledgedCommits, auditRows: audits.length };
}
