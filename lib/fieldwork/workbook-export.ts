import "server-only";
import ExcelJS from "exceljs";
import type { Knex } from "knex";
import { listItemsByDrawId, type SampleItemRecord } from "@/lib/data/sample-items";
import { conflict } from "@/lib/errors";
import { loadSampleView } from "@/lib/samples/context";
import { JUDGEMENT_CAUTION } from "@/lib/samples/evaluate";
import type { TestDirection } from "@/lib/sampling";
import { CAUSE_LABELS, MISSTATEMENT_CAUSES } from "@/lib/validation/sample";
import { safeCellText } from "./cell-text";
import { writeCoverSheet } from "./workbook-cover";
import {
  columnsFor,
  ITEMS_SHEET,
  resultFingerprint,
  STATUS_LABELS,
  workbookKindFor,
  type ColumnKey,
  type RowResult,
  type WorkbookKind,
} from "./workbook-layout";

const MONEY_FORMAT = "#,##0.00;-#,##0.00";
const listOf = (values: string[]) => [`"${values.join(",")}"`];
const text = (v: string | null) => (v ? safeCellText(v) : null);

export function resultOfItem(item: SampleItemRecord): RowResult {
  return {
    status: item.status === "void" ? "not-started" : item.status,
    auditedValue: item.auditedValue,
    cause: (item.cause as RowResult["cause"]) ?? null,
    causeNote: item.causeNote || null,
    deviation: item.deviation,
    deviationNature: item.deviationNature || null,
    comment: item.comment || null,
  };
}

/** How the item came into the sample: a key item (examined 100 %) with its reason, a haphazard pick, or the sample. */
export function selectedAsText(item: Pick<SampleItemRecord, "keyItem" | "keyReason" | "pickedAt">): string {
  if (item.keyItem)
    return item.keyReason ? `Key item (examined 100 %): ${item.keyReason}` : "Key item (examined 100 %)";
  return item.pickedAt ? "Haphazard pick" : "Sample";
}

/** The misstatement column's formula: book − audited; an item that could not be audited counts in full in the direction tested (lib/samples/item-misstatement.ts). */
function misstatementFormula(letter: (k: ColumnKey) => string, row: number, direction: TestDirection) {
  const book = `${letter("bookValue")}${row}`;
  const audited = `${letter("auditedValue")}${row}`;
  const unauditable = direction === "understatement" ? `-ABS(${book})` : book;
  return `IF(${letter("status")}${row}="${STATUS_LABELS["not-auditable"]}",${unauditable},IF(${audited}="","",${book}-${audited}))`;
}

function cellValues(
  kind: WorkbookKind,
  item: SampleItemRecord,
  letter: (k: ColumnKey) => string,
  row: number,
  direction: TestDirection,
): Partial<Record<ColumnKey, ExcelJS.CellValue>> {
  const r = resultOfItem(item);
  return {
    order: item.selectionOrder,
    itemRef: safeCellText(item.itemRef),
    description: text(item.description),
    bookValue: Number(item.bookValue),
    selectedAs: text(selectedAsText(item)),
    auditedValue: r.auditedValue === null ? null : Number(r.auditedValue),
    status: STATUS_LABELS[r.status],
    cause: r.cause ? CAUSE_LABELS[r.cause] : null,
    causeNote: text(r.causeNote),
    comment: text(r.comment),
    deviation: r.deviation === null ? null : r.deviation ? "Yes" : "No",
    deviationNature: text(r.deviationNature),
    misstatement:
      kind === "deviations"
        ? null
        : {
            formula: misstatementFormula(letter, row, direction),
            result: item.misstatement === null ? "" : Number(item.misstatement),
          },
    itemId: item.id,
    version: item.version,
    exported: resultFingerprint(kind, r),
  };
}

const VALIDATIONS: Partial<Record<ColumnKey, ExcelJS.DataValidation>> = {
  status: {
    type: "list",
    allowBlank: true,
    formulae: listOf(Object.values(STATUS_LABELS)),
    showErrorMessage: true,
    errorTitle: "Status",
    error: `Choose ${Object.values(STATUS_LABELS).join(", ")}.`,
  },
  cause: {
    type: "list",
    allowBlank: true,
    formulae: listOf(MISSTATEMENT_CAUSES.map((c) => CAUSE_LABELS[c])),
    showErrorMessage: true,
    errorTitle: "Cause",
    error: "Choose a cause from the list.",
  },
  deviation: {
    type: "list",
    allowBlank: true,
    formulae: listOf(["Yes", "No"]),
    showErrorMessage: true,
    errorTitle: "Deviation",
    error: "Answer Yes or No.",
  },
};

function writeItemsSheet(
  wb: ExcelJS.Workbook,
  kind: WorkbookKind,
  items: SampleItemRecord[],
  direction: TestDirection,
) {
  const ws = wb.addWorksheet(ITEMS_SHEET, { views: [{ state: "frozen", ySplit: 1 }] });
  const columns = columnsFor(kind);
  ws.columns = columns.map((c) => ({ key: c.key, header: c.header, width: c.width, hidden: c.hidden ?? false }));
  ws.getRow(1).font = { bold: true };
  const letter = (k: ColumnKey) => ws.getColumn(k).letter;
  items.forEach((item, i) => {
    const rowNumber = i + 2;
    const row = ws.addRow(cellValues(kind, item, letter, rowNumber, direction));
    for (const c of columns) {
      const cell = row.getCell(c.key);
      if (c.key === "bookValue" || c.key === "auditedValue" || c.key === "misstatement") cell.numFmt = MONEY_FORMAT;
      if (c.fill) {
        cell.protection = { locked: false };
        cell.fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFFFF8DC" } };
      }
      const validation = VALIDATIONS[c.key];
      if (validation) cell.dataValidation = validation;
    }
  });
  // The sheet is left unprotected so people can sort and filter it (Excel refuses to sort a protected
  // range that holds locked cells): rows are matched back by their hidden item id and reference, and
  // the import refuses a changed book value, so nothing relies on the order or on protection. The
  // fill-in columns stay marked unlocked and shaded.
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } };
}

/** The fieldwork workbook of a drawn sample: a cover sheet and the Items sheet to fill. */
export async function buildFieldworkWorkbook(
  db: Knex,
  { engagementId, sampleId, exportedBy }: { engagementId: number; sampleId: number; exportedBy: string },
) {
  const view = await loadSampleView(db, { engagementId, sampleId });
  if (!view.currentDraw)
    throw conflict("The sample has not been drawn yet; draw it before exporting the fieldwork workbook.");
  const items = (await listItemsByDrawId(db, { drawId: view.currentDraw.id })).items.filter((i) => i.status !== "void");
  const kind = workbookKindFor(view.sample.method);
  const wb = new ExcelJS.Workbook();
  wb.creator = "Sondage";
  wb.created = new Date();
  await writeCoverSheet(wb, {
    ...view,
    draw: view.currentDraw,
    kind,
    itemCount: items.length,
    exportedBy,
    caution: JUDGEMENT_CAUTION,
  });
  writeItemsSheet(wb, kind, items, view.sample.direction);
  const bytes = Buffer.from(await wb.xlsx.writeBuffer());
  const slug =
    view.sample.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 40) || "sample";
  return { bytes, fileName: `fieldwork-${slug}-${sampleId}.xlsx` };
}
