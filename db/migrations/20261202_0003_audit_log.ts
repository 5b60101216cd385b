import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("audit_log", (t) => {
    t.bigIncrements("id").primary();
    t.integer("actor_user_id").unsigned().nullable().references("users.id");
    t.timestamp("at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer("engagement_id").unsigned().nullable();
    t.string("entity", 60).notNullable();
    t.string("entity_id", 60).notNullable();
    t.string("action", 60).notNullable();
    t.json("before_json").nullable();
    t.json("after_json").nullable();
    t.index(["entity", "entity_id"]);
    t.index(["engagement_id", "at"]);
  });
  await knex.schema.createTable("sign_in_attempts", (t) => {
    t.bigIncrements("id").primary();
    t.string("email", 254).notNullable();
    t.string("ip", 64).notNullable();
    t.boolean("succeeded").notNullable();
    t.string("reason", 60).nullable();
    t.timestamp("at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["email", "at"]);
    t.index(["ip", "at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("sign_in_attempts");
  await knex.schema.dropTable("audit_log");
}
