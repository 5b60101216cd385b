import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("population_uploads", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.integer("uploaded_by").unsigned().notNullable().references("users.id");
    t.string("file_name", 255).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.specificType("sha256", "CHAR(64)").notNullable();
    t.string("temp_path", 500).notNullable();
    t.json("inspection_json").notNullable();
    t.enu("status", ["inspected", "loading", "rejected", "loaded", "expired"]).notNullable().defaultTo("inspected");
    t.json("problems_json").nullable();
    t.integer("problem_count").unsigned().notNullable().defaultTo(0);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["engagement_id", "created_at"]);
    t.index(["uploaded_by", "status"]);
  });
  await knex.schema.createTable("populations", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.integer("upload_id").unsigned().nullable().references("population_uploads.id");
    t.string("name", 200).notNullable();
    t.string("source_file_name", 255).notNullable();
    t.bigInteger("source_size_bytes").unsigned().notNullable();
    t.specificType("source_sha256", "CHAR(64)").notNullable();
    t.string("source_object_key", 300).notNullable();
    t.json("mapping_json").notNullable();
    t.integer("row_count").unsigned().notNullable().defaultTo(0);
    t.decimal("total", 20, 2).notNullable().defaultTo(0);
    t.integer("positive_count").unsigned().notNullable().defaultTo(0);
    t.decimal("positive_total", 20, 2).notNullable().defaultTo(0);
    t.integer("zero_count").unsigned().notNullable().defaultTo(0);
    t.integer("negative_count").unsigned().notNullable().defaultTo(0);
    t.decimal("negative_total", 20, 2).notNullable().defaultTo(0);
    t.decimal("control_total", 20, 2).nullable();
    t.integer("control_count").unsigned().nullable();
    t.text("reconciliation_explanation").nullable();
    t.integer("reconciled_by").unsigned().nullable().references("users.id");
    t.timestamp("reconciled_at", { precision: 3 }).nullable();
    // loading: rows going in (never visible: the load commits with status unreconciled);
    // unreconciled → reconciled once the control total agrees or the difference is explained.
    t.enu("status", ["loading", "unreconciled", "reconciled", "superseded"]).notNullable().defaultTo("loading");
    t.integer("supersedes_id").unsigned().nullable().references("populations.id");
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["engagement_id", "status"]);
  });
  await knex.schema.createTable("population_items", (t) => {
    t.integer("population_id").unsigned().notNullable();
    t.integer("row_number").unsigned().notNullable();
    t.string("item_ref", 255).notNullable();
    t.text("description").nullable();
    t.decimal("book_value", 18, 2).notNullable();
    t.date("item_date").nullable();
    t.json("extra").nullable();
    t.primary(["population_id", "row_number"]);
    t.index(["population_id", "item_ref"], "population_items_ref");
    t.index(["population_id", "book_value"], "population_items_book_value");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("population_items");
  await knex.schema.dropTable("populations");
  await knex.schema.dropTable("population_uploads");
}
