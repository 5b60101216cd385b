import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("advisor_runs", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.integer("sample_id").unsigned().notNullable().references("samples.id");
    t.integer("population_id").unsigned().notNullable().references("populations.id");
    t.integer("plan_version").unsigned().notNullable();
    t.specificType("cache_key", "CHAR(64)").notNullable();
    t.enu("status", ["running", "done", "cancelled", "failed"]).notNullable().defaultTo("running");
    t.json("request_json").notNullable();
    t.specificType("result_json", "LONGTEXT").nullable();
    t.text("error").nullable();
    t.integer("duration_ms").unsigned().nullable();
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("finished_at", { precision: 3 }).nullable();
    t.index(["sample_id", "cache_key"]);
  });
  await knex.schema.alterTable("samples", (t) => {
    t.integer("advisor_run_id").unsigned().nullable().references("advisor_runs.id");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropForeign(["advisor_run_id"]);
    t.dropColumn("advisor_run_id");
  });
  await knex.schema.dropTable("advisor_runs");
}
