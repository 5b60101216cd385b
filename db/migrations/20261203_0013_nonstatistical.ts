import type { Knex } from "knex";

const METHODS = "'mus','random','systematic','stratified','attribute'";

/**
 * Nonstatistical samples (issue 15) and key items for every method (issue 14 §4): the method, a
 * haphazard draw (no seed re-performs it), key items examined 100 % with the reason each was chosen,
 * haphazard picks with who and when, and anomalous misstatements with their justification and acceptance.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table samples modify method enum(${METHODS},'nonstatistical') not null`);
  await knex.raw("alter table sample_draws modify seed_source enum('generated','entered','haphazard') not null");
  await knex.raw(
    "alter table sample_items modify origin enum('selection','extension','replacement','key-item','haphazard') not null default 'selection'",
  );
  await knex.schema.alterTable("sample_items", (t) => {
    t.boolean("key_item").notNullable().defaultTo(false);
    t.text("key_reason").nullable();
    t.integer("picked_by").unsigned().nullable().references("users.id");
    t.timestamp("picked_at", { precision: 3 }).nullable();
    t.text("anomaly_justification").nullable();
    t.integer("anomaly_marked_by").unsigned().nullable().references("users.id");
    t.timestamp("anomaly_marked_at", { precision: 3 }).nullable();
    t.integer("anomaly_accepted_by").unsigned().nullable().references("users.id");
    t.timestamp("anomaly_accepted_at", { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("sample_items", (t) => {
    t.dropForeign(["picked_by"]);
    t.dropForeign(["anomaly_marked_by"]);
    t.dropForeign(["anomaly_accepted_by"]);
    t.dropColumn("key_item");
    t.dropColumn("key_reason");
    t.dropColumn("picked_by");
    t.dropColumn("picked_at");
    t.dropColumn("anomaly_justification");
    t.dropColumn("anomaly_marked_by");
    t.dropColumn("anomaly_marked_at");
    t.dropColumn("anomaly_accepted_by");
    t.dropColumn("anomaly_accepted_at");
  });
  await knex("sample_items").whereIn("origin", ["key-item", "haphazard"]).update({ origin: "selection" });
  await knex.raw(
    "alter table sample_items modify origin enum('selection','extension','replacement') not null default 'selection'",
  );
  await knex("sample_draws").where({ seed_source: "haphazard" }).update({ seed_source: "generated" });
  await knex.raw("alter table sample_draws modify seed_source enum('generated','entered') not null");
  await knex("samples").where({ method: "nonstatistical" }).delete();
  await knex.raw(`alter table samples modify method enum(${METHODS}) not null`);
}
