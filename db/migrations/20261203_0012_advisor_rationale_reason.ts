import type { Knex } from "knex";

/** The written reason kept with an advisor run adopted as the rationale when it does not simply back the plan. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.text("advisor_run_reason").nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropColumn("advisor_run_reason");
  });
}
