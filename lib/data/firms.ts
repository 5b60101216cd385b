import "server-only";
import type { Knex } from "knex";

/** The firm's name, or undefined when no such firm. */
export async function getFirmNameById(db: Knex, { firmId }: { firmId: number }): Promise<string | undefined> {
  return (await db("firms").where({ id: firmId }).first("name"))?.name;
}
