import type { Knex } from "knex";

/** The firm's methodology settings, versioned (a save adds a version), and the version stamped on each plan. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("firm_methodology", (t) => {
    t.increments("id").primary();
    t.integer("firm_id").unsigned().notNullable().references("firms.id");
    t.integer("version").unsigned().notNullable();
    t.json("settings_json").notNullable();
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["firm_id", "version"]);
  });
  await knex.schema.alterTable("samples", (t) => {
    t.json("methodology_json").nullable();
    t.integer("methodology_version").unsigned().nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropColumn("methodology_json");
    t.dropColumn("methodology_version");
  });
  await knex.schema.dropTable("firm_methodology");
}
