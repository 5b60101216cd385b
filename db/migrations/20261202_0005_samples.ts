import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("samples", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.integer("population_id").unsigned().notNullable().references("populations.id");
    t.string("name", 200).notNullable();
    t.text("objective").notNullable();
    t.string("assertion", 200).notNullable();
    t.enu("direction", ["overstatement", "understatement", "both"]).notNullable();
    t.enu("method", ["mus", "random", "systematic", "stratified", "attribute"]).notNullable();
    t.string("estimator", 30).nullable();
    t.json("params_json").notNullable();
    t.json("plan_json").notNullable(); // the size computation: formula, inputs, computed size, strata
    t.integer("computed_size").unsigned().notNullable();
    t.integer("chosen_size").unsigned().notNullable();
    t.text("size_reason").nullable();
    t.enu("status", ["planned", "drawn"]).notNullable().defaultTo("planned");
    t.integer("plan_version").unsigned().notNullable().defaultTo(1);
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["engagement_id"]);
  });
  await knex.schema.createTable("sample_draws", (t) => {
    t.increments("id").primary();
    t.integer("sample_id").unsigned().notNullable().references("samples.id");
    t.integer("version").unsigned().notNullable();
    t.bigInteger("seed").unsigned().notNullable();
    t.enu("seed_source", ["generated", "entered"]).notNullable();
    t.string("algorithm", 120).notNullable();
    t.string("algorithm_version", 20).notNullable();
    t.specificType("population_sha256", "CHAR(64)").notNullable();
    t.json("inputs_json").notNullable(); // everything the selection used: sizes, interval, strata
    t.specificType("selection_sha256", "CHAR(64)").notNullable();
    t.integer("drawn_by").unsigned().notNullable().references("users.id");
    t.timestamp("drawn_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.boolean("current").notNullable().defaultTo(true);
    t.timestamp("reperformed_at", { precision: 3 }).nullable();
    t.boolean("reperform_matches").nullable();
    t.unique(["sample_id", "version"]);
  });
  await knex.schema.createTable("sample_items", (t) => {
    t.increments("id").primary();
    t.integer("sample_id").unsigned().notNullable().references("samples.id");
    t.integer("draw_id").unsigned().notNullable().references("sample_draws.id");
    t.integer("selection_order").unsigned().notNullable();
    t.integer("population_row_number").unsigned().notNullable();
    t.string("item_ref", 255).notNullable();
    t.text("description").nullable();
    t.decimal("book_value", 18, 2).notNullable();
    t.json("hit_points").nullable();
    t.boolean("top_stratum").notNullable().defaultTo(false);
    t.integer("stratum").unsigned().nullable();
    t.enu("origin", ["selection", "extension", "replacement"]).notNullable().defaultTo("selection");
    t.integer("replaces_item_id").unsigned().nullable();
    t.enu("status", ["not-started", "done", "not-auditable", "void"]).notNullable().defaultTo("not-started");
    t.decimal("audited_value", 18, 2).nullable();
    t.string("cause", 40).nullable();
    t.text("cause_note").nullable();
    t.boolean("deviation").nullable();
    t.text("deviation_nature").nullable();
    t.text("comment").nullable();
    t.text("void_reason").nullable();
    t.integer("version").unsigned().notNullable().defaultTo(1);
    t.integer("updated_by").unsigned().nullable().references("users.id");
    t.timestamp("updated_at", { precision: 3 }).nullable();
    t.index(["sample_id", "draw_id", "selection_order"]);
    t.index(["sample_id", "item_ref"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("sample_items");
  await knex.schema.dropTable("sample_draws");
  await knex.schema.dropTable("samples");
}
