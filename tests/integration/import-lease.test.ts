import { createHash } from "node:crypto";
import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/knex";
import { call, callEvents } from "./support/call";
import { makeEngagement, makeFirm, makeUser } from "./support/factory";
import { RECEIVABLES_MAPPING, populationState, upload } from "./support/populations";
import * as load from "@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/load/route";
import * as inspect from "@/app/api/engagements/[engagementId]/populations/uploads/[uploadId]/route";
import { claimUploadForLoading, getUploadById } from "@/lib/data/population-uploads";
import { loadPopulation } from "@/lib/populations/load-population";
import { getObjectStream } from "@/lib/storage/objects";
import { LoadPopulationSchema } from "@/lib/validation/population";

vi.mock("@/lib/auth/session-user", async () => (await import("./support/session")).sessionModule);

const CSV = "Invoice,Customer,Amount\nINV-1,Alder,100.00\nINV-2,Birch,250.50\nINV-3,Cedar,-20.00\n";
let senior: number, engagement: number;

beforeAll(async () => {
  const firm = await makeFirm();
  senior = await makeUser(firm, "senior");
  const manager = await makeUser(firm, "manager");
  engagement = await makeEngagement(firm, manager, [
    [manager, "manager"],
    [senior, "senior"],
  ]);
});

afterAll(async () => {
  await getDb().destroy();
});

const loadAgain = (uploadId: number) =>
  callEvents(load.POST, "POST", {
    as: senior,
    params: { engagementId: String(engagement), uploadId: String(uploadId) },
    body: { name: "Receivables", mapping: RECEIVABLES_MAPPING },
  });

describe("an upload's bytes live in object storage", () => {
  it("stores the bytes before the inspection answers, keeps no file on this server, and the stored copy hashes as received", async () => {
    const up = await upload(senior, engagement, "stored.csv", CSV);
    expect(up.status).toBe(201);
    const row = (await getDb()("population_uploads").where({ id: up.json.upload.id }).first())!;
    expect(row.object_key).toMatch(new RegExp(`^engagements/${engagement}/uploads/`));
    expect(fs.existsSync(row.temp_path)).toBe(false);
    const { body } = await getObjectStream({ key: row.object_key! });
    const hash = createHash("sha256");
    for await (const chunk of body) hash.update(chunk as Buffer);
    expect(hash.digest("hex")).toBe(createHash("sha256").update(CSV).digest("hex"));
    const loaded = await loadAgain(up.json.upload.id);
    expect(loaded.last).toMatchObject({ type: "loaded", rowCount: 3, total: "330.50" });
  });
});

describe("a load whose server died", () => {
  it("holds the upload while its lease runs, then is marked failed with a message, and loads again at once", async () => {
    const up = await upload(senior, engagement, "dead-server.csv", CSV);
    const uploadId = up.json.upload.id as number;
    // Another app server claims the upload and then stops: its lease is never renewed.
    await claimUploadForLoading(getDb(), { uploadId, userId: senior, holder: "server-that-died" });
    const blocked = await loadAgain(uploadId);
    expect(blocked.status).toBe(409);
    expect(JSON.stringify(blocked.json)).toMatch(/already have a ledger loading/);

    // The lease runs out (moved back rather than waiting LEASE_SECONDS).
    await getDb()("population_upload_leases")
      .where({ upload_id: uploadId })
      .update({ expires_at: getDb().raw("NOW(3) - INTERVAL 1 SECOND") });
    const view = await call(inspect.GET, "GET", {
      as: senior,
      params: { engagementId: String(engagement), uploadId: String(uploadId) },
    });
    expect(view.json.upload.failureMessage).toMatch(
      /server loading dead-server\.csv stopped before the load finished\. Nothing was stored/,
    );
    expect((await getDb()("population_uploads").where({ id: uploadId }).first("status"))!.status).toBe("failed");

    const again = await loadAgain(uploadId);
    expect(again.last).toMatchObject({ type: "loaded", rowCount: 3 });
    expect(await getDb()("population_uploads").where({ id: uploadId }).first("status")).toEqual({ status: "loaded" });
    expect(await getDb()("population_upload_leases").where({ upload_id: uploadId }).first()).toBeUndefined();
  });

  it("a load whose lease another server took over stores nothing", async () => {
    const up = await upload(senior, engagement, "taken-over.csv", CSV);
    const uploadId = up.json.upload.id as number;
    await claimUploadForLoading(getDb(), { uploadId, userId: senior, holder: "slow-server" });
    await getDb()("population_upload_leases").where({ upload_id: uploadId }).update({ holder: "other-server" });
    const before = await populationState();
    const record = await getUploadById(getDb(), { engagementId: engagement, uploadId });
    await expect(
      loadPopulation(getDb(), {
        upload: record,
        actorId: senior,
        holder: "slow-server",
        input: LoadPopulationSchema.parse({ name: "Taken over", mapping: RECEIVABLES_MAPPING }),
        onProgress: () => undefined,
      }),
    ).rejects.toThrow(/lost its claim/);
    expect(await populationState()).toEqual(before);
    expect(await getDb()("population_uploads").where({ id: uploadId }).first("status")).toEqual({ status: "loading" });
    expect(await getDb()("population_upload_leases").where({ upload_id: uploadId }).first("holder")).toEqual({
      holder: "other-server",
    });
  });
});
