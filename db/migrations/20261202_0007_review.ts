import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.integer("preparer_signed_by").unsigned().nullable().references("users.id");
    t.string("preparer_signed_role", 20).nullable();
    t.timestamp("preparer_signed_at", { precision: 3 }).nullable();
    t.integer("reviewer_signed_by").unsigned().nullable().references("users.id");
    t.string("reviewer_signed_role", 20).nullable();
    t.timestamp("reviewer_signed_at", { precision: 3 }).nullable();
    t.integer("locked_by").unsigned().nullable().references("users.id");
    t.timestamp("locked_at", { precision: 3 }).nullable();
    t.string("workpaper_object_key", 300).nullable();
    t.specificType("workpaper_sha256", "CHAR(64)").nullable();
    t.integer("workpaper_size_bytes").unsigned().nullable();
    t.string("workpaper_reference", 40).nullable();
  });
  await knex.schema.createTable("review_notes", (t) => {
    t.increments("id").primary();
    t.integer("sample_id").unsigned().notNullable().references("samples.id");
    t.integer("sample_item_id").unsigned().nullable().references("sample_items.id");
    t.text("text").notNullable();
    t.integer("raised_by").unsigned().notNullable().references("users.id");
    t.timestamp("raised_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.enu("status", ["open", "answered", "cleared"]).notNullable().defaultTo("open");
    t.text("answer").nullable();
    t.integer("answered_by").unsigned().nullable().references("users.id");
    t.timestamp("answered_at", { precision: 3 }).nullable();
    t.integer("cleared_by").unsigned().nullable().references("users.id");
    t.timestamp("cleared_at", { precision: 3 }).nullable();
    t.index(["sample_id", "status"]);
  });
  await knex.schema.alterTable("audit_log", (t) => {
    t.integer("sample_id").unsigned().nullable();
    t.index(["sample_id", "id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("audit_log", (t) => {
    t.dropIndex(["sample_id", "id"]);
    t.dropColumn("sample_id");
  });
  await knex.schema.dropTable("review_notes");
  await knex.schema.alterTable("samples", (t) => {
    t.dropForeign(["preparer_signed_by"]);
    t.dropForeign(["reviewer_signed_by"]);
    t.dropForeign(["locked_by"]);
    for (const c of [
      "preparer_signed_by",
      "preparer_signed_role",
      "preparer_signed_at",
      "reviewer_signed_by",
      "reviewer_signed_role",
      "reviewer_signed_at",
      "locked_by",
      "locked_at",
      "workpaper_object_key",
      "workpaper_sha256",
      "workpaper_size_bytes",
      "workpaper_reference",
    ])
      t.dropColumn(c);
  });
}
