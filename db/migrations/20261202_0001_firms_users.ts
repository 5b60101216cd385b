import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("firms", (t) => {
    t.increments("id").primary();
    t.string("name", 200).notNullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  await knex.schema.createTable("users", (t) => {
    t.increments("id").primary();
    t.integer("firm_id").unsigned().notNullable().references("firms.id");
    t.string("email", 254).notNullable().unique();
    t.string("name", 200).notNullable();
    t.string("password_hash", 100).notNullable();
    t.enu("firm_role", ["admin", "member"]).notNullable().defaultTo("member");
    t.enu("grade", ["staff", "senior", "manager", "partner", "client"]).notNullable();
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["firm_id", "active"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("users");
  await knex.schema.dropTable("firms");
}
