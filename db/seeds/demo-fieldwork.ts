// Usage: tsx db/seeds/demo-fieldwork.ts <baseUrl> — loads the invented demo ledger into the Tessaly
// engagement through the running app's own API (as the demo senior and staff would), reconciles it,
// plans and draws a monetary-unit sample and records a first few results. Skips if already done.
import os from "node:os";
import path from "node:path";
import fs from "node:fs";
import { generateLedgerCsv } from "../../tests/bench/generate-ledger";
import { HttpSession } from "../../tests/bench/support/http-session";
import { DEMO_PASSWORD } from "./demo-scenario";

const SENIOR = "senior@marrow-quill.example";
const STAFF = "staff@marrow-quill.example";
const CLIENT = "carla.mendes@tessaly-outdoor.example";
const MANAGER = "manager@marrow-quill.example";

// Invented for the demo. Positive amounts overstate the recorded figure (and here profit and net assets).
const DEMO_ENTRIES = [
  {
    kind: "factual",
    account: "Revenue / trade receivables",
    assertion: "Cut-off",
    description:
      "Two September invoices for goods delivered on 2 October recorded as September revenue (found in the cut-off test, not in a sample).",
    amount: "18450.00",
    incomeEffect: "18450.00",
    balanceEffect: "18450.00",
  },
  {
    kind: "judgemental",
    account: "Allowance for doubtful receivables",
    assertion: "Valuation",
    description:
      "Management provides 2.0 % of balances over 90 days; our estimate from the last three years' write-offs is 3.1 %. Difference between the two point estimates.",
    amount: "41200.00",
    incomeEffect: "41200.00",
    balanceEffect: "41200.00",
  },
];

async function readLoadStream(res: Response) {
  const lines = (await res.text())
    .split("\n")
    .filter(Boolean)
    .map((l) => JSON.parse(l));
  return lines.at(-1);
}

async function main(baseUrl: string) {
  const senior = new HttpSession(baseUrl);
  await senior.signIn(SENIOR, DEMO_PASSWORD);
  const { engagements } = await senior.json<{ engagements: { id: number; clientName: string }[] }>("/api/engagements");
  const tessaly = engagements.find((e) => e.clientName.startsWith("Tessaly"));
  if (!tessaly) throw new Error("demo engagement missing: run the seed first");
  const base = `/api/engagements/${tessaly.id}`;
  const { populations } = await senior.json<{ populations: unknown[] }>(`${base}/populations`);
  if (populations.length > 0) return console.log("demo fieldwork: already present, left alone");

  const file = path.join(os.tmpdir(), "tessaly-receivables-2026-09-30.csv");
  await generateLedgerCsv(file, 2400, 20260930);
  const up = await senior.uploadFile<{ upload: { id: number } }>(
    `${base}/populations/uploads?fileName=tessaly-receivables-2026-09-30.csv`,
    file,
  );
  if (up.status !== 201) throw new Error(`upload answered ${up.status}`);
  const loaded = await readLoadStream(
    await senior.fetch(`${base}/populations/uploads/${up.body.upload.id}/load`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({
        name: "Trade receivables at 30 Sep 2026",
        mapping: {
          itemRefColumn: "Invoice",
          bookValueColumn: "Amount",
          descriptionColumn: "Customer",
          dateColumn: "Due",
          extraColumns: ["Posted"],
        },
      }),
    }),
  );
  if (loaded.type !== "loaded") throw new Error(`load: ${JSON.stringify(loaded)}`);
  fs.rmSync(file, { force: true });
  await senior.json(`${base}/populations/${loaded.populationId}/reconciliation`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ controlTotal: loaded.total, controlCount: loaded.rowCount }),
  });

  const { sample } = await senior.json<{ sample: { id: number } }>(`${base}/samples`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({
      populationId: loaded.populationId,
      name: "Receivables existence — positive confirmations",
      objective: "Confirm that recorded trade receivables exist and are owed to the company at the period end.",
      assertion: "Existence",
      direction: "overstatement",
      params: {
        method: "mus",
        confidence: 0.95,
        tolerableMisstatement: "60000",
        expectedMisstatement: "8000",
        factorMode: "exact",
      },
    }),
  });
  await senior.json(`${base}/samples/${sample.id}/draw`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: "{}",
  });

  const staff = new HttpSession(baseUrl);
  await staff.signIn(STAFF, DEMO_PASSWORD);
  const { items } = await staff.json<{ items: { id: number; version: number; bookValue: string }[] }>(
    `${base}/samples/${sample.id}/items?pageSize=40`,
  );
  for (const [i, it] of items.slice(0, 24).entries()) {
    const body =
      i === 5
        ? {
            status: "done",
            auditedValue: (Number(it.bookValue) * 0.8).toFixed(2),
            cause: "pricing",
            comment: "Customer confirmed a lower amount; credit note issued after year end",
          }
        : i === 11
          ? { status: "not-auditable", comment: "No reply to confirmation; no alternative evidence obtained" }
          : { status: "done", auditedValue: it.bookValue, comment: "Agreed to confirmation" };
    await staff.json(`${base}/samples/${sample.id}/items/${it.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ version: it.version, ...body }),
    });
  }
  // A classical plan left undrawn, so the estimator advisor can be tried on the demo ledger (it can
  // also borrow the misstatements found in the confirmation sample above).
  const { sample: valuation } = await senior.json<{ sample: { id: number } }>(`${base}/samples`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({
      populationId: loaded.populationId,
      name: "Receivables valuation — classical estimate",
      objective: "Estimate the audited value of trade receivables to test their valuation at the period end.",
      assertion: "Valuation",
      direction: "overstatement",
      params: {
        method: "random",
        estimator: "difference",
        confidence: 0.95,
        tolerableMisstatement: "60000",
        sampleSize: 120,
        sizeReason: "Planned size to be confirmed with the estimator advisor before drawing",
      },
    }),
  });
  const nonstatistical = await demoNonstatistical({
    senior,
    staff,
    base,
    populationId: loaded.populationId,
    total: Number(loaded.total),
  });
  // The summary of misstatements (issue 16): both samples feed it (the drawn one with results, the
  // classical plan once it has results); the manager sets a clearly trivial threshold and the team
  // enters two misstatements found outside sampling.
  const manager = new HttpSession(baseUrl);
  await manager.signIn(MANAGER, DEMO_PASSWORD);
  await manager.json(`${base}/misstatements/settings`, {
    method: "PUT",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ clearlyTrivial: "12000.00", approachingShare: 0.75 }),
  });
  for (const entry of DEMO_ENTRIES) {
    await senior.json(`${base}/misstatements/entries`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(entry),
    });
  }
  // A request list to the client contact for the first eight selections still without a result.
  const { contacts } = await senior.json<{ contacts: { userId: number; email: string }[] }>(`${base}/client-contacts`);
  const carla = contacts.find((c) => c.email === CLIENT);
  if (carla) {
    const due = new Date(Date.now() + 10 * 86400_000).toISOString().slice(0, 10);
    await senior.json(`${base}/samples/${sample.id}/requests`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({
        title: "Receivables confirmations — supporting documents",
        contactUserId: carla.userId,
        dueDate: due,
        items: items.length > 24 ? items.slice(24, 32).map((it) => it.id) : "all",
        needs: ["invoice", "remittance", "delivery-note"],
        needsNote:
          "For each invoice, the signed delivery note and the remittance of any payment received after 30 September.",
        message:
          "Hello Carla, these are the invoices we selected for testing. Thank you for sending the documents by the due date.",
      }),
    });
  }
  console.log(
    `demo fieldwork: ${loaded.rowCount} ledger lines loaded, sample ${sample.id} drawn, 24 results recorded, 2 misstatements entered on the summary${carla ? ", a request list sent to the client contact" : ""}; sample ${valuation.id} planned for the advisor; nonstatistical sample ${nonstatistical} with key items and haphazard picks`,
  );
}

const JSON_HEADERS = { "content-type": "application/json" };

/**
 * A nonstatistical cut-off test sized from the risk assessment: the five largest balances and one
 * chosen invoice are key items, the rest is picked haphazardly on the grid, and results are keyed in.
 */
async function demoNonstatistical({
  senior,
  staff,
  base,
  populationId,
  total,
}: {
  senior: HttpSession;
  staff: HttpSession;
  base: string;
  populationId: number;
  total: number;
}) {
  const { items: largest } = await senior.json<{ items: { itemRef: string; bookValue: string; rowNumber: number }[] }>(
    `${base}/populations/${populationId}/items?sort=book&dir=desc&pageSize=25`,
  );
  const threshold = largest[4].bookValue; // the five largest balances
  const { sample } = await senior.json<{ sample: { id: number; chosenSize: number } }>(`${base}/samples`, {
    method: "POST",
    headers: JSON_HEADERS,
    body: JSON.stringify({
      populationId,
      name: "Receivables cut-off — key items and a haphazard selection",
      objective: "Test that invoices recorded in trade receivables relate to goods delivered before the period end.",
      assertion: "Cut-off",
      direction: "overstatement",
      params: {
        method: "nonstatistical",
        sizingBasis: "risk-assessment",
        assessedRisk: "slightly-below-maximum",
        otherProceduresRisk: "moderate",
        tolerableMisstatement: Math.round(total / 20).toFixed(2),
        expectedMisstatement: Math.round(total / 400).toFixed(2),
        keyItemThreshold: threshold,
        keyItems: [
          { itemRef: largest[12].itemRef, reason: "Invoiced on the last day of the period to a new customer" },
        ],
        selection: "haphazard",
        projection: "ratio",
      },
    }),
  });
  await senior.json(`${base}/samples/${sample.id}/draw`, { method: "POST", headers: JSON_HEADERS, body: "{}" });
  // The senior's picks, spread over the ledger by eye (invented for the demo).
  const rows = Array.from(
    { length: sample.chosenSize },
    (_, i) => 2 + Math.floor(((i + 0.37) * 2397) / sample.chosenSize) + ((i * 7) % 5),
  );
  for (const rowNumber of rows) {
    await senior.fetch(`${base}/samples/${sample.id}/picks`, {
      method: "POST",
      headers: JSON_HEADERS,
      body: JSON.stringify({ rowNumber }),
    });
  }
  const { items } = await staff.json<{ items: { id: number; version: number; bookValue: string; keyItem: boolean }[] }>(
    `${base}/samples/${sample.id}/items?pageSize=500`,
  );
  const keyed = items
    .filter((i) => i.keyItem)
    .concat(items.filter((i) => !i.keyItem).slice(0, Math.ceil(items.length * 0.6)));
  for (const [i, it] of keyed.entries()) {
    const body =
      i === 1
        ? {
            status: "done",
            auditedValue: (Number(it.bookValue) - 1250).toFixed(2),
            cause: "cut-off",
            comment: "Goods shipped on 2 October; invoice dated 30 September",
          }
        : i === 9
          ? {
              status: "done",
              auditedValue: (Number(it.bookValue) * 0.9).toFixed(2),
              cause: "cut-off",
              comment: "Part of the order delivered after the period end",
            }
          : {
              status: "done",
              auditedValue: it.bookValue,
              comment: "Agreed to delivery note dated before the period end",
            };
    await staff.json(`${base}/samples/${sample.id}/items/${it.id}`, {
      method: "PATCH",
      headers: JSON_HEADERS,
      body: JSON.stringify({ version: it.version, ...body }),
    });
  }
  return sample.id;
}

main(process.argv[2] ?? "http://127.0.0.1:3000").catch((err: unknown) => {
  console.error("demo fieldwork:", err instanceof Error ? err.message : err);
  process.exit(1);
});
