import { afterAll, describe, expect, it } from "vitest";
import knex from "knex";
import { buildKnexConfig } from "@/db/knex-config";
import { recreateDatabase } from "@/db/recreate-database";

const NAME = "sondage_migrations";
let db: ReturnType<typeof knex> | undefined;

afterAll(async () => {
  await db?.destroy();
});

async function tables(conn: ReturnType<typeof knex>): Promise<string[]> {
  const [rows] = await conn.raw("SHOW TABLES");
  return (rows as Record<string, string>[])
    .map((r) => Object.values(r)[0])
    .filter((t) => !t.startsWith("knex_"))
    .sort();
}

describe("migrations", () => {
  it("go up, all the way down, and up again on an empty database", async () => {
    await recreateDatabase(NAME);
    db = knex(buildKnexConfig({ ...process.env, DB_NAME: NAME }));
    await db.migrate.latest();
    expect(await tables(db)).toEqual([
      "advisor_runs",
      "audit_log",
      "engagement_members",
      "engagements",
      "firm_methodology",
      "firms",
      "item_evidence",
      "mail_outbox",
      "misstatement_corrections",
      "misstatement_entries",
      "misstatement_entry_evidence",
      "misstatement_notes",
      "misstatement_sample_snapshots",
      "misstatement_summaries",
      "population_items",
      "population_upload_leases",
      "population_uploads",
      "populations",
      "request_files",
      "request_items",
      "request_lists",
      "review_notes",
      "sample_draws",
      "sample_items",
      "samples",
      "sign_in_attempts",
      "user_invitations",
      "users",
    ]);
    await db.migrate.rollback(undefined, true);
    expect(await tables(db)).toEqual([]);
    await db.migrate.latest();
    expect(await tables(db)).toContain("engagements");
    const [cols] = await db.raw("SHOW COLUMNS FROM engagements WHERE Field = 'overall_materiality'");
    expect(cols[0].Type).toBe("decimal(18,2)");
    // 0011: the auditor's conclusion and response live beside the sample's sign-offs.
    const [conclusionCols] = await db.raw("SHOW COLUMNS FROM samples WHERE Field LIKE 'auditor_%'");
    expect((conclusionCols as { Field: string }[]).map((c) => c.Field).sort()).toEqual([
      "auditor_conclusion",
      "auditor_conclusion_at",
      "auditor_conclusion_by",
      "auditor_conclusion_role",
      "auditor_responses_json",
    ]);
    const [reason] = await db.raw("SHOW COLUMNS FROM samples WHERE Field = 'advisor_run_reason'"); // 0012
    expect(reason[0].Type).toBe("text");
    // 0016 (issue 19): sessions ended by a password reset; archived populations.
    const [valid] = await db.raw("SHOW COLUMNS FROM users WHERE Field = 'sessions_valid_after'");
    expect(valid[0].Type).toBe("timestamp(3)");
    const [archived] = await db.raw("SHOW COLUMNS FROM populations WHERE Field IN ('archived_at', 'archived_by')");
    expect(archived.map((c: { Field: string }) => c.Field).sort()).toEqual(["archived_at", "archived_by"]);
    // 0013: nonstatistical samples, key items, haphazard picks and anomalies
    const [method] = await db.raw("SHOW COLUMNS FROM samples WHERE Field = 'method'");
    expect(method[0].Type).toContain("'nonstatistical'");
    const [itemCols] = await db.raw(
      "SHOW COLUMNS FROM sample_items WHERE Field IN ('key_item', 'key_reason', 'picked_by', 'picked_at', 'anomaly_justification', 'anomaly_accepted_by')",
    );
    expect(itemCols).toHaveLength(6);
  });
});
