import type { Knex } from "knex";

const AUDITOR_ROLES = "'viewer','staff','senior','manager','partner'";

/**
 * Client requests: the engagement role `client` (outside the auditor hierarchy), request lists sent
 * to a client contact from a drawn sample, the items on them, the files the client uploads per item,
 * and one-time invitation links by which a new client contact chooses a password.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`alter table engagement_members modify role enum(${AUDITOR_ROLES},'client') not null`);
  // Client staff used to sit on teams as viewers; from now on they are client contacts, who see only their requests.
  await knex.raw(
    "update engagement_members m join users u on u.id = m.user_id set m.role = 'client' where u.grade = 'client'",
  );

  await knex.schema.createTable("request_lists", (t) => {
    t.increments("id").primary();
    t.integer("engagement_id").unsigned().notNullable().references("engagements.id");
    t.integer("sample_id").unsigned().notNullable().references("samples.id");
    t.string("title", 200).notNullable();
    t.text("message").nullable();
    t.integer("contact_user_id").unsigned().notNullable().references("users.id");
    t.date("due_date").notNullable();
    t.boolean("show_book_values").notNullable().defaultTo(false);
    t.enu("status", ["open", "closed"]).notNullable().defaultTo("open");
    t.string("closed_reason", 200).nullable();
    t.timestamp("closed_at", { precision: 3 }).nullable();
    t.date("last_reminded_on").nullable();
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["sample_id"]);
    t.index(["contact_user_id", "status"]);
    t.index(["status", "due_date"]);
  });
  await knex.schema.createTable("request_items", (t) => {
    t.increments("id").primary();
    t.integer("request_list_id").unsigned().notNullable().references("request_lists.id");
    t.integer("sample_item_id").unsigned().notNullable().references("sample_items.id");
    t.integer("position").unsigned().notNullable();
    t.json("needs_json").notNullable();
    t.text("needs_note").nullable();
    t.enu("status", ["requested", "provided", "accepted", "needs-more"]).notNullable().defaultTo("requested");
    t.text("client_note").nullable();
    t.text("return_reason").nullable();
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["request_list_id", "sample_item_id"]);
    t.index(["sample_item_id"]);
  });
  await knex.schema.createTable("request_files", (t) => {
    t.increments("id").primary();
    t.integer("request_item_id").unsigned().notNullable().references("request_items.id");
    t.string("file_name", 255).notNullable();
    t.string("content_type", 120).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.specificType("sha256", "CHAR(64)").notNullable();
    t.string("object_key", 500).notNullable();
    t.integer("uploaded_by").unsigned().notNullable().references("users.id");
    t.timestamp("uploaded_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.enu("status", ["pending", "accepted", "returned"]).notNullable().defaultTo("pending");
    t.integer("decided_by").unsigned().nullable().references("users.id");
    t.timestamp("decided_at", { precision: 3 }).nullable();
    t.text("return_reason").nullable();
    t.integer("evidence_id").unsigned().nullable().references("item_evidence.id");
    t.index(["request_item_id", "status"]);
  });
  await knex.schema.createTable("user_invitations", (t) => {
    t.increments("id").primary();
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.specificType("token_sha256", "CHAR(64)").notNullable().unique();
    t.timestamp("expires_at", { precision: 3 }).notNullable();
    t.timestamp("used_at", { precision: 3 }).nullable();
    t.integer("created_by").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("user_invitations");
  await knex.schema.dropTable("request_files");
  await knex.schema.dropTable("request_items");
  await knex.schema.dropTable("request_lists");
  await knex.raw("update engagement_members set role = 'viewer' where role = 'client'");
  await knex.raw(`alter table engagement_members modify role enum(${AUDITOR_ROLES}) not null`);
}
