import type { Knex } from "knex";

// Issue 19: a password reset (or an accepted invitation) ends the person's open sessions — sessions
// issued before users.sessions_valid_after are refused — and a population can be archived, kept
// on record but out of the way.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("users", (t) => {
    t.timestamp("sessions_valid_after", { precision: 3 }).nullable();
  });
  await knex.schema.alterTable("populations", (t) => {
    t.timestamp("archived_at", { precision: 3 }).nullable();
    t.integer("archived_by").unsigned().nullable().references("users.id");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("populations", (t) => {
    t.dropForeign(["archived_by"]);
    t.dropColumn("archived_by");
    t.dropColumn("archived_at");
  });
  await knex.schema.alterTable("users", (t) => {
    t.dropColumn("sessions_valid_after");
  });
}
