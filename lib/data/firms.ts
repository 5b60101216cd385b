import "server-only";
import type { Knex } from "knex";

/** The firm's name, or null when there is no such firm. */
export async function getFirmNameById(db: Knex | Knex.Transaction, { firmId }: { firmId: number }) {
  const row = await db("firms").where({ id: firmId }).first("name");
  return row ? row.name : null;
}
