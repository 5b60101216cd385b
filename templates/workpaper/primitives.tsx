/** Building blocks shared by the workpaper's sections: numbered headings, facts and tables. */
import type { ReactNode } from "react";
import { Text, View } from "@react-pdf/renderer";
import type { Style } from "./styles";
import { s } from "./styles";

/** A numbered section; `keepTogether` moves it whole to the next page rather than splitting it. */
export function Section({
  number,
  title,
  children,
  keepTogether,
}: {
  number: string;
  title: string;
  children: ReactNode;
  keepTogether?: boolean;
}) {
  return (
    <View style={s.section} wrap={!keepTogether}>
      <View style={s.sectionHead} minPresenceAhead={60} wrap={false}>
        <Text style={s.sectionNumber}>{number}</Text>
        <Text style={s.sectionTitle}>{title}</Text>
      </View>
      {children}
    </View>
  );
}

export function SubHead({ children }: { children: ReactNode }) {
  return (
    <Text style={s.subHead} minPresenceAhead={30}>
      {children}
    </Text>
  );
}

export interface Fact {
  label: string;
  value: ReactNode;
  mono?: boolean;
}

export function Facts({ facts }: { facts: Fact[] }) {
  return (
    <View>
      {facts.map((fact) => (
        <View key={fact.label} style={s.factRow} wrap={false}>
          <Text style={s.factLabel}>{fact.label}</Text>
          {typeof fact.value === "string" || typeof fact.value === "number" ? (
            <Text style={[s.factValue, fact.mono ? s.mono : {}]}>{fact.value}</Text>
          ) : (
            <View style={s.factValue}>{fact.value}</View>
          )}
        </View>
      ))}
    </View>
  );
}

export interface Column {
  label: string;
  /** Fixed width in points, or a flex share when `flex` is set. */
  width?: number;
  flex?: number;
  align?: "left" | "right";
  mono?: boolean;
}

export interface TableRow {
  cells: ReactNode[];
  total?: boolean;
  muted?: boolean;
}

function cellStyle(column: Column): Style[] {
  const style: Style[] = [s.cell];
  if (column.width !== undefined) style.push({ width: column.width });
  if (column.flex !== undefined) style.push({ flex: column.flex });
  if (column.align === "right") style.push(s.right);
  return style;
}

/** A table whose header row repeats on every page it spans (fixed inside the wrapping table). */
export function Table({
  columns,
  rows,
  repeatHeader = true,
}: {
  columns: Column[];
  rows: TableRow[];
  repeatHeader?: boolean;
}) {
  return (
    <View style={s.table}>
      <View style={s.headRow} fixed={repeatHeader}>
        {columns.map((column, i) => (
          <Text key={i} style={[...cellStyle(column), s.headCell]}>
            {column.label}
          </Text>
        ))}
      </View>
      {rows.map((row, r) => (
        <View key={r} style={row.total ? s.totalRow : s.row} wrap={false}>
          {row.cells.map((cell, c) => {
            const column = columns[c];
            const extra: Style[] = [];
            if (column.mono) extra.push(s.mono);
            if (row.total) extra.push(s.bold);
            if (row.muted) extra.push(s.faint);
            return typeof cell === "string" || typeof cell === "number" || cell === null ? (
              <Text key={c} style={[...cellStyle(column), ...extra]}>
                {cell ?? ""}
              </Text>
            ) : (
              <View key={c} style={cellStyle(column)}>
                {cell}
              </View>
            );
          })}
        </View>
      ))}
    </View>
  );
}

export function Callout({ children, tone = "note" }: { children: ReactNode; tone?: "note" | "warning" }) {
  return (
    <View style={tone === "warning" ? s.warning : s.callout} wrap={false}>
      {typeof children === "string" ? <Text>{children}</Text> : children}
    </View>
  );
}

export function Paragraph({ children, style }: { children: ReactNode; style?: Style }) {
  return <Text style={style ? [s.paragraph, style] : s.paragraph}>{children}</Text>;
}
