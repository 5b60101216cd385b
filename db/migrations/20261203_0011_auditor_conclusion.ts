import type { Knex } from "knex";

const COLUMNS = [
  "auditor_conclusion",
  "auditor_responses_json",
  "auditor_conclusion_by",
  "auditor_conclusion_role",
  "auditor_conclusion_at",
];

/** The auditor's own conclusion and response on a sample, apart from the result Sondage computes (issue 13). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.text("auditor_conclusion").nullable();
    t.json("auditor_responses_json").nullable(); // [{ kind, amount, note }]
    t.integer("auditor_conclusion_by").unsigned().nullable().references("users.id");
    t.string("auditor_conclusion_role", 20).nullable();
    t.timestamp("auditor_conclusion_at", { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropForeign(["auditor_conclusion_by"]);
    for (const c of COLUMNS) t.dropColumn(c);
  });
}
