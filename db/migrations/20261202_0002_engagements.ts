import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("engagements", (t) => {
    t.increments("id").primary();
    t.integer("firm_id").unsigned().notNullable().references("firms.id");
    t.string("client_name", 200).notNullable();
    t.string("name", 200).notNullable();
    t.date("period_end").notNullable();
    t.specificType("currency", "CHAR(3)").notNullable();
    t.decimal("overall_materiality", 18, 2).notNullable();
    t.decimal("performance_materiality", 18, 2).notNullable();
    t.enu("status", ["planning", "fieldwork", "completion", "archived"]).notNullable().defaultTo("planning");
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["firm_id"]);
  });
  await knex.schema.createTable("engagement_members", (t) => {
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id").onDelete("CASCADE");
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.enu("role", ["viewer", "staff", "senior", "manager", "partner"]).notNullable();
    t.timestamp("added_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(["engagement_id", "user_id"]);
    t.index(["user_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("engagement_members");
  await knex.schema.dropTable("engagements");
}
