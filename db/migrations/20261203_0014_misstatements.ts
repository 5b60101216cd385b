import type { Knex } from "knex";

/**
 * The engagement's summary of misstatements (issue 16): one summary row per engagement (settings,
 * sign-offs, lock), the team's own entries with their evidence, corrections of sample rows, the
 * summary's review notes, and the rows of locked samples frozen at their lock.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("misstatement_summaries", (t) => {
    t.integer("engagement_id").unsigned().primary().references("engagements.id");
    t.decimal("clearly_trivial", 18, 2).notNullable().defaultTo(0);
    t.decimal("approaching_share", 5, 4).notNullable().defaultTo(0.75);
    t.integer("preparer_signed_by").unsigned().nullable().references("users.id");
    t.string("preparer_signed_role", 20).nullable();
    t.timestamp("preparer_signed_at", { precision: 3 }).nullable();
    t.integer("reviewer_signed_by").unsigned().nullable().references("users.id");
    t.string("reviewer_signed_role", 20).nullable();
    t.timestamp("reviewer_signed_at", { precision: 3 }).nullable();
    t.specificType("signed_rows_sha256", "CHAR(64)").nullable();
    t.integer("locked_by").unsigned().nullable().references("users.id");
    t.timestamp("locked_at", { precision: 3 }).nullable();
    t.json("locked_view_json").nullable();
    t.string("workpaper_object_key", 300).nullable();
    t.specificType("workpaper_sha256", "CHAR(64)").nullable();
    t.integer("workpaper_size_bytes").unsigned().nullable();
    t.string("workpaper_reference", 40).nullable();
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  await knex.schema.createTable("misstatement_entries", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.enu("kind", ["factual", "judgemental", "prior-period"]).notNullable();
    t.string("account", 200).notNullable();
    t.string("assertion", 100).notNullable();
    t.text("description").notNullable();
    t.decimal("amount", 18, 2).notNullable();
    t.decimal("income_effect", 18, 2).notNullable();
    t.decimal("balance_effect", 18, 2).notNullable();
    t.boolean("corrected").notNullable().defaultTo(false);
    t.date("corrected_on").nullable();
    t.string("correction_reference", 200).nullable();
    t.integer("version").unsigned().notNullable().defaultTo(1);
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer("updated_by").unsigned().nullable().references("users.id");
    t.timestamp("updated_at", { precision: 3 }).nullable();
    t.timestamp("deleted_at", { precision: 3 }).nullable();
    t.integer("deleted_by").unsigned().nullable().references("users.id");
    t.index(["engagement_id", "deleted_at"]);
  });
  await knex.schema.createTable("misstatement_entry_evidence", (t) => {
    t.increments("id").primary();
    t.integer("entry_id").unsigned().notNullable().references("misstatement_entries.id");
    t.string("file_name", 255).notNullable();
    t.string("content_type", 120).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.specificType("sha256", "CHAR(64)").notNullable();
    t.string("object_key", 500).notNullable();
    t.integer("uploaded_by").unsigned().notNullable().references("users.id");
    t.timestamp("uploaded_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("deleted_at", { precision: 3 }).nullable();
    t.integer("deleted_by").unsigned().nullable().references("users.id");
    t.index(["entry_id", "deleted_at"]);
  });
  await knex.schema.createTable("misstatement_corrections", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.integer("sample_id").unsigned().notNullable().references("samples.id");
    t.enu("part", ["factual", "projected"]).notNullable();
    t.date("corrected_on").notNullable();
    t.string("reference", 200).notNullable();
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["sample_id", "part"]);
  });
  await knex.schema.createTable("misstatement_notes", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.text("text").notNullable();
    t.integer("raised_by").unsigned().notNullable().references("users.id");
    t.timestamp("raised_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.enu("status", ["open", "answered", "cleared"]).notNullable().defaultTo("open");
    t.text("answer").nullable();
    t.integer("answered_by").unsigned().nullable().references("users.id");
    t.timestamp("answered_at", { precision: 3 }).nullable();
    t.integer("cleared_by").unsigned().nullable().references("users.id");
    t.timestamp("cleared_at", { precision: 3 }).nullable();
    t.index(["engagement_id", "status"]);
  });
  await knex.schema.createTable("misstatement_sample_snapshots", (t) => {
    t.integer("sample_id").unsigned().primary().references("samples.id");
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.json("contribution_json").notNullable();
    t.timestamp("frozen_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    "misstatement_sample_snapshots",
    "misstatement_notes",
    "misstatement_corrections",
    "misstatement_entry_evidence",
    "misstatement_entries",
    "misstatement_summaries",
  ]) {
    await knex.schema.dropTable(table);
  }
}
