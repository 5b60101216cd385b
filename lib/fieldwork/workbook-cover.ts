import "server-only";
import type ExcelJS from "exceljs";
import type { EngagementRecord } from "@/lib/data/engagements";
import type { PopulationRecord } from "@/lib/data/populations";
import type { DrawRecord, SampleRecord } from "@/lib/data/samples";
import { METHOD_LABELS } from "@/lib/validation/sample";
import { safeCellText } from "./cell-text";
import { randomStartOf } from "@/lib/samples/random-start";
import { COVER_SHEET, ITEMS_SHEET, STATUS_LABELS, type WorkbookKind } from "./workbook-layout";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { countOf, formatMoney } from "@/lib/format/number";

interface CoverFacts {
  engagement: EngagementRecord;
  sample: SampleRecord;
  population: PopulationRecord;
  draw: DrawRecord;
  kind: WorkbookKind;
  itemCount: number;
  exportedBy: string;
  caution: string;
}

function instructions(kind: WorkbookKind): string[] {
  const common = [
    `Fill in only the shaded columns of the ${ITEMS_SHEET} sheet; the other columns are locked.`,
    `Status: ${Object.values(STATUS_LABELS).join(", ")}. An item cannot be Done without its result.`,
    "You may sort and filter the rows as you like: they are matched back by item reference and a hidden item id, not by their order. Do not add or delete rows, and do not change a book value.",
    "Import the filled workbook on the sample's page. Every row is checked first: if any row has a problem, nothing is applied and the problems are listed by row and column.",
    "If someone changed an item in Sondage after this workbook was exported, the import refuses your change to that row: export a fresh workbook.",
  ];
  return kind === "amounts"
    ? [
        ...common,
        "Audited value: the amount you audited (2 decimals at most). Misstatement = book value − audited value; an item you could not audit counts as fully misstated.",
        "Cause: pick from the list; for Other, describe it in Cause detail.",
      ]
    : [
        ...common,
        "Deviation: Yes or No for each item tested; describe any deviation in Nature of deviation. An item you could not test counts as a deviation.",
      ];
}

/** The cover sheet: what the workbook is for, where the selection came from, how to fill it, and the judgement caution. */
export async function writeCoverSheet(wb: ExcelJS.Workbook, f: CoverFacts) {
  const randomStart = randomStartOf(f.draw);
  const ws = wb.addWorksheet(COVER_SHEET);
  ws.columns = [{ width: 28 }, { width: 90 }];
  const rows: [string, string | number][] = [
    [
      "Engagement",
      `${f.engagement.clientName} — ${f.engagement.name} (period end ${formatDate(f.engagement.periodEnd)})`,
    ],
    ["Sample", f.sample.name],
    ["Objective", f.sample.objective],
    ["Assertion", f.sample.assertion],
    ["Method", METHOD_LABELS[f.sample.method] + (f.sample.estimator ? `, ${f.sample.estimator}` : "")],
    ["Confidence", `${Math.round(f.sample.params.confidence * 1000) / 10}%`],
    ["Seed", String(f.draw.seed)],
    ...(randomStart === null
      ? []
      : [[`Random start (${f.engagement.currency})`, formatMoney(randomStart.toFixed(2))] as [string, string]]),
    ...(f.draw.inputs.interval && f.sample.method === "mus"
      ? [
          [`Sampling interval (${f.engagement.currency})`, formatMoney(f.draw.inputs.interval.toFixed(2))] as [
            string,
            string,
          ],
        ]
      : []),
    [
      "Draw",
      `version ${f.draw.version}, ${f.draw.algorithm} ${f.draw.algorithmVersion}, drawn ${formatDateTime(f.draw.drawnAt)} by ${f.draw.drawnByName}`,
    ],
    [
      "Population",
      `${f.population.name} (${countOf(f.population.rowCount, "item")}, total ${formatMoney(f.population.total)})`,
    ],
    ["Population SHA-256", f.draw.populationSha256],
    ["Selection SHA-256", f.draw.selectionSha256],
    ["Items in this workbook", f.itemCount],
    ["Exported", `${formatDateTime(new Date())} by ${f.exportedBy}`],
  ];
  const title = ws.addRow(["Fieldwork workbook"]);
  title.font = { bold: true, size: 14 };
  ws.addRow([]);
  for (const [label, value] of rows)
    ws.addRow([label, typeof value === "string" ? safeCellText(value) : value]).getCell(1).font = { bold: true };
  ws.addRow([]);
  ws.addRow(["Instructions"]).font = { bold: true };
  for (const line of instructions(f.kind)) ws.addRow(["", line]);
  ws.addRow([]);
  const caution = ws.addRow(["Caution", f.caution]);
  caution.font = { italic: true };
  ws.getColumn(2).alignment = { wrapText: true, vertical: "top" };
  await ws.protect("", { selectLockedCells: true, selectUnlockedCells: true });
}
