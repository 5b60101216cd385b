import { existsSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { generateLedgerCsv } from "../generate-ledger";
import { HttpSession } from "../support/http-session";

/** The password of the staff accounts the load runs add (never a demo sign-in). */
export const LOAD_PASSWORD = "load-bench-password-2026";

/** `count` staff accounts on the engagement (load1@… loadN@…), straight in the database; their e-mails. */
export async function addLoadUsers(db: Knex, engagementId: number, count: number): Promise<string[]> {
  const firm = (await db("firms").first("id"))!;
  const hash = await bcrypt.hash(LOAD_PASSWORD, 10);
  const emails = Array.from({ length: count }, (_, i) => `load${i + 1}@marrow-quill.example`);
  for (const email of emails) {
    const [id] = await db("users").insert({
      firm_id: firm.id,
      email,
      name: `Load ${email.slice(4, 6)}`,
      grade: "staff",
      firm_role: "member",
      password_hash: hash,
    });
    await db("engagement_members").insert({ engagement_id: engagementId, user_id: id, role: "staff" });
  }
  return emails;
}

export async function signInAll(appUrl: string, emails: string[]): Promise<HttpSession[]> {
  const sessions: HttpSession[] = [];
  for (const email of emails) {
    const s = new HttpSession(appUrl);
    await s.signIn(email, LOAD_PASSWORD);
    sessions.push(s);
  }
  return sessions;
}

/** Uploads the generated ledger of `rows` rows (made once per size in the temp folder), retrying a 503 up to 3 times. */
export async function uploadLedger(
  senior: HttpSession,
  base: string,
  rows: number,
  name: string,
  log: (line: string) => void,
) {
  const file = path.join(tmpdir(), `load-bench-${rows}.csv`);
  if (!existsSync(file)) await generateLedgerCsv(file, rows, 20261202 + rows);
  let up = await senior.uploadFile<{ upload: { id: number } }>(
    `${base}/populations/uploads?fileName=${name}.csv`,
    file,
  );
  for (let i = 0; up.status === 503 && i < 3; i++) {
    log(`upload answered 503 (database busy); again in 10 s`);
    await new Promise((r) => setTimeout(r, 10_000));
    up = await senior.uploadFile<{ upload: { id: number } }>(`${base}/populations/uploads?fileName=${name}.csv`, file);
  }
  if (up.status !== 201) throw new Error(`upload answered ${up.status}`);
  return { uploadId: up.body.upload.id, file };
}

/** A random sample of `size` items with a difference estimator, drawn with seed 42; its id. */
export async function drawSample(
  senior: HttpSession,
  base: string,
  populationId: number,
  size: number,
): Promise<number> {
  const { sample } = await senior.json<{ sample: { id: number } }>(`${base}/samples`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({
      populationId,
      name: `Load sample ${size}`,
      objective: "Concurrent result entry under load.",
      assertion: "Existence",
      direction: "overstatement",
      params: {
        method: "random",
        estimator: "difference",
        tolerableMisstatement: "50000",
        sampleSize: size,
        sizeReason: "load benchmark",
      },
    }),
  });
  await senior.json(`${base}/samples/${sample.id}/draw`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ seed: 42 }),
  });
  return sample.id;
}

export async function sampleItems(session: HttpSession, base: string, sampleId: number) {
  const { items } = await session.json<{ items: { id: number; version: number }[] }>(
    `${base}/samples/${sampleId}/items?pageSize=500`,
  );
  return items;
}
