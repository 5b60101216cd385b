/** Section 5: every sampled item with its book value, audited value, misstatement, cause and comment. */
import { Text, View } from "@react-pdf/renderer";
import { centsToDecimal, decimalToCents } from "@/lib/money";
import { ITEM_STATUS_LABELS } from "@/lib/fieldwork/field-labels";
import { Section, Table, type Column, type TableRow } from "./primitives";
import { colours, s } from "./styles";
import type { WorkpaperData, WorkpaperItem } from "./workpaper-data";
import { formatMoney } from "@/lib/format/number";

const STATUS = ITEM_STATUS_LABELS;
const ORIGIN = {
  selection: "",
  extension: "extension",
  replacement: "replacement",
  "key-item": "key item (100 %)",
  haphazard: "haphazard pick",
} as const;

function ReferenceCell({ item, showHits }: { item: WorkpaperItem; showHits: boolean }) {
  const tags = [
    `row ${item.rowNumber}`,
    showHits && item.hitPoints.length > 0 ? `hit at ${item.hitPoints.map(formatMoney).join(", ")}` : "",
    item.topStratum ? "top stratum" : "",
    ORIGIN[item.origin],
  ]
    .filter(Boolean)
    .join(" · ");
  return (
    <View>
      <Text style={{ fontSize: 7.5 }}>
        {item.reference}
        {item.description ? <Text style={s.soft}>{`  ${item.description}`}</Text> : null}
      </Text>
      <Text style={[s.faint, { fontSize: 6.3 }]}>{tags}</Text>
    </View>
  );
}

function NoteCell({ parts }: { parts: (string | null)[] }) {
  const [first, ...rest] = parts.filter((p): p is string => !!p);
  return (
    <View>
      {first && <Text style={{ fontSize: 7.2 }}>{first}</Text>}
      {rest.map((p, i) => (
        <Text key={i} style={[s.soft, { fontSize: 6.8 }]}>
          {p}
        </Text>
      ))}
    </View>
  );
}

function sum(values: (string | null)[]): string {
  return centsToDecimal(values.reduce<bigint>((acc, v) => (v === null ? acc : acc + decimalToCents(v)), 0n));
}

function monetaryTable(
  data: WorkpaperData,
  items: WorkpaperItem[],
  live: WorkpaperItem[] | null,
): { columns: Column[]; rows: TableRow[] } {
  const stratified = data.plan.method === "stratified";
  const columns: Column[] = [
    { label: "#", width: 22, align: "right" },
    ...(stratified ? [{ label: "Str.", width: 24, align: "right" as const }] : []),
    { label: "Reference and description", flex: 1.5 },
    { label: `Book (${data.currency})`, width: 66, align: "right" },
    { label: `Audited (${data.currency})`, width: 66, align: "right" },
    { label: "Misstatement", width: 62, align: "right" },
    { label: "Status", width: 46 },
    { label: "Cause and comment", flex: 1.3 },
  ];
  const rows: TableRow[] = items.map((item) => ({
    muted: item.status === "void",
    cells: [
      String(item.selectionOrder),
      ...(stratified ? [item.stratum === null ? "" : String(item.stratum)] : []),
      <ReferenceCell key="r" item={item} showHits={data.plan.method === "mus"} />,
      formatMoney(item.bookValue),
      item.auditedValue === null ? "—" : formatMoney(item.auditedValue),
      item.misstatement === null ? "—" : formatMoney(item.misstatement),
      STATUS[item.status],
      <NoteCell key="n" parts={[item.cause, item.comment]} />,
    ],
  }));
  if (!live) return { columns, rows };
  const audited = live.filter((i) => i.status === "done");
  rows.push({
    total: true,
    cells: [
      "",
      ...(stratified ? [""] : []),
      `Total — ${live.length} items, ${audited.length} audited`,
      formatMoney(sum(live.map((i) => i.bookValue))),
      formatMoney(sum(audited.map((i) => i.auditedValue))),
      formatMoney(sum(audited.map((i) => i.misstatement))),
      "",
      "",
    ],
  });
  return { columns, rows };
}

function attributeTable(
  data: WorkpaperData,
  items: WorkpaperItem[],
  live: WorkpaperItem[] | null,
): { columns: Column[]; rows: TableRow[] } {
  const columns: Column[] = [
    { label: "#", width: 22, align: "right" },
    { label: "Reference and description", flex: 1.3 },
    { label: `Amount (${data.currency})`, width: 70, align: "right" },
    { label: "Deviation", width: 48 },
    { label: "Status", width: 50 },
    { label: "Nature of deviation and comment", flex: 1.6 },
  ];
  const rows: TableRow[] = items.map((item) => ({
    muted: item.status === "void",
    cells: [
      String(item.selectionOrder),
      <ReferenceCell key="r" item={item} showHits={false} />,
      formatMoney(item.bookValue),
      item.deviation === null ? "—" : item.deviation ? "Yes" : "No",
      item.status === "done" ? "Tested" : STATUS[item.status],
      <NoteCell key="n" parts={[item.deviationNature, item.cause, item.comment]} />,
    ],
  }));
  if (!live) return { columns, rows };
  const deviations = live.filter((i) => i.deviation === true).length;
  rows.push({
    total: true,
    cells: [
      "",
      `Total — ${live.length} items`,
      formatMoney(sum(live.map((i) => i.bookValue))),
      `${deviations}`,
      "",
      "",
    ],
  });
  return { columns, rows };
}

/**
 * Section 5. `items` is one page-sized run of the sample (see results-pages.ts): the first run
 * carries the heading, the last the totals; the others continue the table under its header row.
 */
export function ResultsSection({
  data,
  items,
  first,
  last,
}: {
  data: WorkpaperData;
  items: WorkpaperItem[];
  first: boolean;
  last: boolean;
}) {
  const live = data.items.filter((i) => i.status !== "void");
  const build = data.plan.method === "attribute" ? attributeTable : monetaryTable;
  const { columns, rows } = build(data, items, last ? live : null);
  const open = live.filter((i) => i.status === "not-started").length;
  const table = <Table columns={columns} rows={rows} />;
  if (!first)
    return (
      <View>
        {table}
        {last && open > 0 && <NotAudited open={open} />}
      </View>
    );
  return (
    <Section number="5" title="Results">
      <Text style={[s.soft, { marginBottom: 4 }]}>
        Misstatement is book value less audited value: overstatement positive, understatement negative.
        {data.plan.method === "mus" ? " Hit points are the cumulative monetary positions that selected each item." : ""}
      </Text>
      {table}
      {last && open > 0 && <NotAudited open={open} />}
    </Section>
  );
}

function NotAudited({ open }: { open: number }) {
  return (
    <Text style={{ color: colours.warn, marginTop: 4 }}>
      {open} item{open === 1 ? " is" : "s are"} not yet audited.
    </Text>
  );
}
