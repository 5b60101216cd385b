import type { Knex } from "knex";

/** Evidence files per sample item; the bytes live in object storage. Deletion is soft so the trail keeps the file. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("item_evidence", (t) => {
    t.increments("id").primary();
    t.integer("sample_item_id").unsigned().notNullable().references("sample_items.id");
    t.string("file_name", 255).notNullable();
    t.string("content_type", 120).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.specificType("sha256", "CHAR(64)").notNullable();
    t.string("object_key", 500).notNullable();
    t.integer("uploaded_by").unsigned().notNullable().references("users.id");
    t.timestamp("uploaded_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("deleted_at", { precision: 3 }).nullable();
    t.integer("deleted_by").unsigned().nullable().references("users.id");
    t.index(["sample_item_id", "deleted_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("item_evidence");
}
