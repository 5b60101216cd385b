// Builds what the matrix probes: an engagement of its own (so nothing another spec reads changes),
// with a loaded population, a pending upload, a drawn sample, an evidence file and a review note;
// and a second firm, whose administrator is partner on an engagement of that firm.
import os from "node:os";
import path from "node:path";
import { rmSync, writeFileSync } from "node:fs";
import bcrypt from "bcryptjs";
import knex from "knex";
import { buildKnexConfig } from "../../../db/knex-config";
import { generateLedgerCsv } from "../../bench/generate-ledger";
import { HttpSession } from "../../bench/support/http-session";
import { DEMO, DEMO_PASSWORD } from "../pages/sign-in-page";
import type { Actor } from "./route-matrix";

export const OTHER_FIRM = { email: "partner@larkspur-audit.example", name: "Ines Okafor" };
/** An auditor who is a viewer on the matrix engagement (the demo's only viewer became a client contact in issue 9). */
export const MATRIX_VIEWER = { email: "viewer@marrow-quill.example", name: "Rowan Ebbe" };

export interface MatrixFixtures {
  sessions: Record<Actor, HttpSession>;
  ids: Record<string, number>;
  /** An engagement of the same firm the partner is on (Bramblecote), and one of the other firm. */
  otherEngagementId: number;
  otherFirmEngagementId: number;
  userIds: Record<string, number>;
}

export function e2eDatabase() {
  // The private server's credentials, as db/load-env.ts reads them (that module uses import.meta, which Playwright's loader refuses).
  const saved = { ...process.env };
  process.loadEnvFile(".env.local");
  Object.assign(process.env, saved);
  const slot = Number(process.env.E2E_SLOT ?? 0);
  return knex(buildKnexConfig({ ...process.env, DB_NAME: slot === 0 ? "sondage_e2e" : `sondage_e2e${slot}` }));
}

async function addMatrixViewer(): Promise<void> {
  const db = e2eDatabase();
  try {
    if (await db("users").where({ email: MATRIX_VIEWER.email }).first("id")) return;
    const firm = (await db("users").where({ email: DEMO.admin.email }).first("firm_id"))!;
    await db("users").insert({
      firm_id: firm.firm_id,
      email: MATRIX_VIEWER.email,
      name: MATRIX_VIEWER.name,
      grade: "staff",
      firm_role: "member",
      password_hash: await bcrypt.hash(DEMO_PASSWORD, 10),
    });
  } finally {
    await db.destroy();
  }
}

/** The client contact joins the matrix engagement with the client role, as an invitation accepted would leave it. */
async function addClientContact(engagementId: number, userId: number): Promise<void> {
  const db = e2eDatabase();
  try {
    await db("engagement_members").insert({ engagement_id: engagementId, user_id: userId, role: "client" });
  } finally {
    await db.destroy();
  }
}

async function addOtherFirm(): Promise<number> {
  const db = e2eDatabase();
  try {
    const existing = await db("engagement_members as m")
      .join("users as u", "u.id", "m.user_id")
      .where("u.email", OTHER_FIRM.email)
      .first("m.engagement_id");
    if (existing) return Number(existing.engagement_id);
    return await db.transaction(async (trx) => {
      const [firmId] = await trx("firms").insert({ name: "Larkspur & Vale Audit (matrix probe)" });
      const [userId] = await trx("users").insert({
        firm_id: firmId,
        email: OTHER_FIRM.email,
        name: OTHER_FIRM.name,
        grade: "partner",
        firm_role: "admin",
        password_hash: await bcrypt.hash(DEMO_PASSWORD, 10),
      });
      const [engagementId] = await trx("engagements").insert({
        firm_id: firmId,
        client_name: "Orrin Valley Mills",
        name: "Audit FY2026",
        period_end: "2026-12-31",
        currency: "USD",
        overall_materiality: "100000.00",
        performance_materiality: "75000.00",
        status: "fieldwork",
        created_by: userId,
      });
      await trx("engagement_members").insert({ engagement_id: engagementId, user_id: userId, role: "partner" });
      return engagementId;
    });
  } finally {
    await db.destroy();
  }
}

async function session(baseUrl: string, email: string): Promise<HttpSession> {
  const s = new HttpSession(baseUrl);
  await s.signIn(email, DEMO_PASSWORD);
  return s;
}

const JSON_HEADERS = { "content-type": "application/json" };
const post = <T = unknown>(s: HttpSession, url: string, body: unknown) =>
  s.json<T>(url, { method: "POST", headers: JSON_HEADERS, body: JSON.stringify(body) });

async function loadPopulation(
  senior: HttpSession,
  base: string,
  file: string,
): Promise<{ populationId: number; uploadId: number; pendingUploadId: number }> {
  const up = await senior.uploadFile<{ upload: { id: number } }>(
    `${base}/populations/uploads?fileName=matrix-ledger.csv`,
    file,
  );
  if (up.status !== 201) throw new Error(`upload answered ${up.status}`);
  const res = await senior.fetch(`${base}/populations/uploads/${up.body.upload.id}/load`, {
    method: "POST",
    headers: JSON_HEADERS,
    body: JSON.stringify({
      name: "Matrix receivables",
      mapping: {
        itemRefColumn: "Invoice",
        bookValueColumn: "Amount",
        descriptionColumn: "Customer",
        dateColumn: "Due",
      },
    }),
  });
  const last = (await res.text())
    .split("\n")
    .filter(Boolean)
    .map((l) => JSON.parse(l))
    .at(-1);
  if (last?.type !== "loaded") throw new Error(`load: ${JSON.stringify(last)}`);
  await post(senior, `${base}/populations/${last.populationId}/reconciliation`, {
    controlTotal: last.total,
    controlCount: last.rowCount,
  });
  const pending = await senior.uploadFile<{ upload: { id: number } }>(
    `${base}/populations/uploads?fileName=matrix-pending.csv`,
    file,
  );
  return { populationId: last.populationId, uploadId: pending.body.upload.id, pendingUploadId: pending.body.upload.id };
}

export async function buildMatrixFixtures(baseUrl: string): Promise<MatrixFixtures> {
  const otherFirmEngagementId = await addOtherFirm();
  await addMatrixViewer();
  const [viewer, staff, senior, manager, partner, admin, otherEngagement, otherFirm, client] = await Promise.all(
    [
      MATRIX_VIEWER.email,
      DEMO.staff.email,
      DEMO.senior.email,
      DEMO.manager.email,
      DEMO.partner.email,
      DEMO.admin.email,
      DEMO.senior2.email,
      OTHER_FIRM.email,
      DEMO.client.email,
    ].map((email) => session(baseUrl, email)),
  );
  const sessions: Record<Actor, HttpSession> = {
    signedOut: new HttpSession(baseUrl),
    viewer,
    staff,
    senior,
    manager,
    partner,
    admin,
    otherEngagement,
    otherFirm,
    client,
  };

  const { users } = await admin.json<{ users: { id: number; email: string }[] }>("/api/users");
  const userIds = Object.fromEntries(users.map((u) => [u.email, u.id]));
  const { engagement } = await post<{ engagement: { id: number } }>(partner, "/api/engagements", {
    clientName: "Matrix Probe Holdings",
    name: `Authorisation matrix ${Date.now()}`,
    periodEnd: "2026-12-31",
    currency: "USD",
    overallMateriality: "500000",
    performanceMateriality: "375000",
  });
  const base = `/api/engagements/${engagement.id}`;
  for (const [who, role] of [
    [DEMO.manager.email, "manager"],
    [DEMO.senior.email, "senior"],
    [DEMO.staff.email, "staff"],
    [MATRIX_VIEWER.email, "viewer"],
  ] as const) {
    await post(partner, `${base}/members`, { userId: userIds[who], role });
  }

  await addClientContact(engagement.id, userIds[DEMO.client.email]);
  const file = path.join(os.tmpdir(), `matrix-ledger-${process.pid}.csv`);
  await generateLedgerCsv(file, 300, 20261231);
  const population = await loadPopulation(senior, base, file).finally(() => rmSync(file, { force: true }));
  const { sample } = await post<{ sample: { id: number } }>(senior, `${base}/samples`, {
    populationId: population.populationId,
    name: "Matrix sample",
    objective: "Probe every route for every caller.",
    assertion: "Existence",
    direction: "overstatement",
    params: {
      method: "mus",
      confidence: 0.95,
      tolerableMisstatement: "60000",
      expectedMisstatement: "8000",
      factorMode: "exact",
    },
  });
  await post(senior, `${base}/samples/${sample.id}/draw`, {});
  const { items } = await staff.json<{ items: { id: number; version: number }[] }>(
    `${base}/samples/${sample.id}/items?pageSize=10`,
  );
  const evidenceFile = path.join(os.tmpdir(), `matrix-evidence-${process.pid}.txt`);
  writeFileSync(evidenceFile, "Confirmation reply: balance agreed.\n");
  const evidence = await staff.uploadFile<{ evidence: { id: number } }>(
    `${base}/samples/${sample.id}/items/${items[0].id}/evidence?fileName=reply.txt`,
    evidenceFile,
  );
  rmSync(evidenceFile, { force: true });
  if (evidence.status !== 201)
    throw new Error(`evidence upload answered ${evidence.status}: ${JSON.stringify(evidence.body)}`);
  const note = await post<{ note?: { id: number }; notes?: { id: number }[] }>(
    manager,
    `${base}/samples/${sample.id}/notes`,
    { text: "Matrix probe note", itemId: items[0].id },
  );
  const noteId = (note.note ?? note.notes?.at(-1))?.id;
  if (noteId === undefined) throw new Error(`note: ${JSON.stringify(note)}`);

  const { engagements } = await partner.json<{ engagements: { id: number; clientName: string }[] }>("/api/engagements");
  const bramblecote = engagements.find((e) => e.clientName.startsWith("Bramblecote"))!;
  return {
    sessions,
    userIds,
    otherEngagementId: bramblecote.id,
    otherFirmEngagementId,
    ids: {
      engagementId: engagement.id,
      populationId: population.populationId,
      uploadId: population.uploadId,
      sampleId: sample.id,
      itemId: items[0].id,
      itemVersion: items[0].version,
      evidenceId: evidence.body.evidence.id,
      noteId,
      userId: userIds[DEMO.staff.email],
      clientUserId: userIds[DEMO.client.email],
    },
  };
}
