import type { Knex } from "knex";

const UPLOAD_STATUSES = ["inspected", "loading", "rejected", "loaded", "expired"];

/**
 * Issue 17 (scale out): what lets any app server pick up work another one started.
 * - population_uploads: the upload's bytes live in object storage (object_key); a dead server's
 *   load is marked failed (failure_message) and can be loaded again.
 * - population_upload_leases: the lease a load holds on its upload, renewed while it runs. A table
 *   of its own: the load's transaction holds a shared lock on the upload row for its whole length
 *   (the populations row it inserts references it), so renewing a lease there would wait on it.
 * - advisor_runs: a cancel flag any server can set and the running server polls, and the running
 *   server's id and heartbeat (a run whose heartbeat stopped is marked interrupted).
 * - mail_outbox: messages written in the same transaction as the change that causes them, sent by
 *   a worker with retries and backoff.
 * - sample_items (draw_id, selection_order): the key the sample grid pages by.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    `ALTER TABLE population_uploads MODIFY status ENUM(${[...UPLOAD_STATUSES, "failed"].map((s) => `'${s}'`).join(", ")}) NOT NULL DEFAULT 'inspected'`,
  );
  await knex.schema.alterTable("population_uploads", (t) => {
    t.string("object_key", 300).nullable();
    t.text("failure_message").nullable();
  });
  await knex.schema.createTable("population_upload_leases", (t) => {
    t.integer("upload_id").unsigned().primary(); // no foreign key: renewing must not touch the upload row
    t.string("holder", 100).notNullable();
    t.timestamp("expires_at", { precision: 3 }).notNullable();
  });
  await knex.schema.alterTable("advisor_runs", (t) => {
    t.timestamp("cancel_requested_at", { precision: 3 }).nullable();
    t.string("server_id", 100).nullable();
    t.timestamp("heartbeat_at", { precision: 3 }).nullable();
  });
  await knex.schema.alterTable("sample_items", (t) => {
    t.index(["draw_id", "selection_order"], "sample_items_draw_order");
  });
  await knex.schema.createTable("mail_outbox", (t) => {
    t.increments("id").primary();
    t.integer("firm_id").unsigned().nullable().references("firms.id");
    t.string("template", 60).notNullable();
    t.string("to_name", 200).notNullable();
    t.string("to_email", 320).notNullable();
    t.string("subject", 500).notNullable();
    t.specificType("text_body", "MEDIUMTEXT").notNullable();
    t.specificType("html_body", "MEDIUMTEXT").notNullable();
    // pending → sending (claimed by one worker) → sent; back to pending with a later next_attempt_at
    // after a refused send; failed after the last attempt; unknown when a worker died mid-send
    // (never resent by itself: the relay may have taken it).
    t.enu("status", ["pending", "sending", "sent", "failed", "unknown"]).notNullable().defaultTo("pending");
    t.integer("attempts").unsigned().notNullable().defaultTo(0);
    t.timestamp("next_attempt_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.string("claimed_by", 100).nullable();
    t.timestamp("claimed_until", { precision: 3 }).nullable();
    t.text("last_error").nullable();
    t.string("message_id", 200).nullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("sent_at", { precision: 3 }).nullable();
    t.index(["status", "next_attempt_at"], "mail_outbox_due");
    t.index(["firm_id", "status"], "mail_outbox_firm");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("mail_outbox");
  await knex.schema.dropTable("population_upload_leases");
  // The draw_id foreign key leans on the new index (MariaDB dropped its own when this one came): give it one back first.
  await knex.schema.alterTable("sample_items", (t) => {
    t.index(["draw_id"], "sample_items_draw_id");
  });
  await knex.schema.alterTable("sample_items", (t) => {
    t.dropIndex(["draw_id", "selection_order"], "sample_items_draw_order");
  });
  await knex.schema.alterTable("advisor_runs", (t) => {
    t.dropColumn("cancel_requested_at");
    t.dropColumn("server_id");
    t.dropColumn("heartbeat_at");
  });
  await knex.schema.alterTable("population_uploads", (t) => {
    t.dropColumn("object_key");
    t.dropColumn("failure_message");
  });
  await knex("population_uploads").where({ status: "failed" }).update({ status: "rejected" });
  await knex.raw(
    `ALTER TABLE population_uploads MODIFY status ENUM(${UPLOAD_STATUSES.map((s) => `'${s}'`).join(", ")}) NOT NULL DEFAULT 'inspected'`,
  );
}
