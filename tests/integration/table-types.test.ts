import fs from "node:fs";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/knex";
import { renderTableTypes } from "@/db/table-types";

afterAll(async () => {
  await getDb().destroy();
});

describe("the table types Knex checks queries against (lib/data/tables.ts)", () => {
  it("match the schema the migrations build (run `npm run db:types` after a migration)", async () => {
    const committed = fs.readFileSync(path.resolve(import.meta.dirname, "../../lib/data/tables.ts"), "utf8");
    expect(await renderTableTypes(getDb())).toBe(committed);
  });

  it("describe every table and read each kind of column as mysql2 hands it back", async () => {
    const text = await renderTableTypes(getDb());
    expect(text).toMatch(/export interface SamplesRow \{[^}]*\n {2}status: "planned" \| "drawn";/);
    expect(text).toMatch(
      /export interface EngagementsRow \{[^}]*\n {2}period_end: string;[^}]*\n {2}overall_materiality: string;/,
    );
    expect(text).toMatch(/export interface AuditLogRow \{\n {2}id: string;/); // BIGINT as an exact string (bigNumberStrings)
    expect(text).toMatch(/export interface UsersRow \{[^}]*\n {2}active: boolean \| 0 \| 1;/);
    expect(text).toContain("    sample_items: Knex.CompositeTableType<SampleItemsRow, SampleItemsWrite>;");
  });
});
