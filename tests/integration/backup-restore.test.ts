// npm run db:backup / db:restore: back up, wipe, restore, and compare every table's row count and
// CHECKSUM TABLE (MariaDB Knowledge Base, "CHECKSUM TABLE": a live checksum of the table's rows),
// and that a locked workpaper's stored SHA-256 still matches its stored object.
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import os from "node:os";
import path from "node:path";
import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import knex, { type Knex } from "knex";
import { getDb } from "@/db/knex";
import { buildKnexConfig } from "@/db/knex-config";
import { getObjectStream } from "@/lib/storage/objects";
import { call } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import {
  drawSample,
  listSampleItems,
  loadCanonicalPopulation,
  planSample,
  saveResult,
  concludeSample,
} from "./support/samples";
import * as signOff from "@/app/api/engagements/[engagementId]/samples/[sampleId]/sign-off/route";
import * as lock from "@/app/api/engagements/[engagementId]/samples/[sampleId]/lock/route";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

const DATABASE = process.env.DB_NAME!;
const FILE = path.join(os.tmpdir(), `sondage-backup-test-${process.pid}.sql.gz`);
let sampleId: number;

beforeAll(async () => {
  const firm = await makeFirm();
  const [staff, senior, manager] = await Promise.all([
    makeUser(firm, "staff"),
    makeUser(firm, "senior"),
    makeUser(firm, "manager"),
  ]);
  const engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
    [staff, "staff"],
  ]);
  const { populationId } = await loadCanonicalPopulation(senior, engagement);
  sampleId = (
    await planSample(senior, engagement, {
      populationId,
      params: { method: "mus", tolerableMisstatement: "15000", factorMode: "table" },
    })
  ).json.sample.id;
  await drawSample(senior, engagement, sampleId, 20261202);
  for (const it of await listSampleItems(staff, engagement, sampleId)) {
    await saveResult(staff, engagement, sampleId, it.id, {
      version: it.version,
      status: "done",
      auditedValue: it.bookValue,
    });
  }
  const p = { engagementId: String(engagement), sampleId: String(sampleId) };
  expect((await concludeSample(staff, engagement, sampleId)).status).toBe(200);
  expect((await call(signOff.POST, "POST", { as: staff, params: p, body: { as: "preparer" } })).status).toBe(200);
  expect((await call(signOff.POST, "POST", { as: manager, params: p, body: { as: "reviewer" } })).status).toBe(200);
  expect((await call(lock.POST, "POST", { as: manager, params: p })).status).toBe(200);
  await getDb().destroy(); // the restore drops the database under the pool
});

afterAll(() => {
  fs.rmSync(FILE, { force: true });
});

async function fingerprint(db: Knex): Promise<Record<string, { rows: number; checksum: string }>> {
  const tables = (await db("information_schema.tables")
    .where({ table_schema: DATABASE, table_type: "BASE TABLE" })
    .orderBy("table_name")
    .pluck("table_name")) as string[];
  const out: Record<string, { rows: number; checksum: string }> = {};
  for (const table of tables) {
    const [count] = await db(table).count({ n: "*" });
    const [[sum]] = await db.raw("CHECKSUM TABLE ??", [table]);
    out[table] = { rows: Number(count.n), checksum: String(sum.Checksum) };
  }
  return out;
}

const script = (name: string, args: string[]) =>
  execFileSync("bash", [path.join("db/scripts", name), ...args], {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "pipe"],
  });

describe("db:backup and db:restore", () => {
  it("restore after a wipe gives back every table with the same rows and checksums, and the locked workpaper still matches its hash", async () => {
    let db = knex(buildKnexConfig());
    const before = await fingerprint(db);
    expect(Object.keys(before).length).toBeGreaterThanOrEqual(12);
    expect(before.samples.rows).toBeGreaterThan(0);
    expect(before.population_items.rows).toBeGreaterThan(0);

    expect(script("db-backup.sh", [FILE, "--database", DATABASE])).toContain(`${DATABASE} → ${FILE}`);
    // Wipe: every table goes.
    await db.raw("SET FOREIGN_KEY_CHECKS = 0");
    for (const table of Object.keys(before)) await db.schema.dropTable(table);
    await db.raw("SET FOREIGN_KEY_CHECKS = 1");
    expect(await fingerprint(db)).toEqual({});
    await db.destroy();

    expect(script("db-restore.sh", [FILE, "--database", DATABASE, "--yes"])).toContain(`→ ${DATABASE}`);
    db = knex(buildKnexConfig());
    try {
      expect(await fingerprint(db)).toEqual(before);
      const sample = (await db("samples")
        .where({ id: sampleId })
        .first("locked_at", "workpaper_object_key", "workpaper_sha256"))!;
      expect(sample.locked_at).not.toBeNull();
      const object = await getObjectStream({ key: sample.workpaper_object_key! });
      const hash = createHash("sha256");
      for await (const chunk of object.body) hash.update(chunk as Buffer);
      expect(hash.digest("hex")).toBe(sample.workpaper_sha256);
    } finally {
      await db.destroy();
    }
  });

  it("refuses a file that is not a complete backup and changes nothing", async () => {
    const broken = `${FILE}.broken`;
    fs.writeFileSync(broken, fs.readFileSync(FILE).subarray(0, 200));
    expect(() => script("db-restore.sh", [broken, "--database", DATABASE, "--yes"])).toThrow(
      /not a complete gzip file/,
    );
    fs.rmSync(broken);
    const db = knex(buildKnexConfig());
    try {
      expect(Number((await db("samples").count({ n: "*" }))[0].n)).toBeGreaterThan(0);
    } finally {
      await db.destroy();
    }
  });
});
