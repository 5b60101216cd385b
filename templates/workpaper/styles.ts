/** The workpaper's look: calm ink on paper, a ledger-green rule, numbered sections. */
import { StyleSheet, type Styles } from "@react-pdf/renderer";
import { MONO, SANS } from "./fonts";

export const colours = {
  ink: "#1E2421",
  soft: "#4A5550",
  faint: "#7C8782",
  hairline: "#D5DBD7",
  ledger: "#1F5E3B",
  ledgerTint: "#EEF4EF",
  ledgerPale: "#F6F9F6",
  warn: "#8A4B0F",
  warnTint: "#FBF3E8",
  draft: "#9B2C2C",
  draftTint: "#F8ECEC",
};

export const PAGE_MARGIN_X = 42;

export const s = StyleSheet.create({
  page: {
    fontFamily: SANS,
    fontSize: 8.5,
    color: colours.ink,
    paddingTop: 78,
    paddingBottom: 62,
    paddingHorizontal: PAGE_MARGIN_X,
  },
  /** Leading lives on the body, not the page: fixed, dynamic nodes (page x of y) re-resolve a
   *  unitless lineHeight on every pagination pass and it grows without bound (react-pdf #3452).
   *  A View resolves a unitless lineHeight against its own font size, so the body sets both. */
  body: { fontSize: 8.5, lineHeight: 1.35 },
  mono: { fontFamily: MONO, fontSize: 7.5 },
  bold: { fontWeight: "bold" },
  soft: { color: colours.soft },
  faint: { color: colours.faint },
  small: { fontSize: 7.5 },
  paragraph: { marginBottom: 5 },
  section: { marginTop: 14 },
  sectionHead: {
    flexDirection: "row",
    alignItems: "flex-end",
    borderBottomWidth: 1.2,
    borderBottomColor: colours.ledger,
    paddingBottom: 3,
    marginBottom: 7,
  },
  sectionNumber: { width: 22, fontWeight: "bold", color: colours.ledger, fontSize: 11, lineHeight: 1.2 },
  sectionTitle: { fontWeight: "bold", fontSize: 11, letterSpacing: 0.2, lineHeight: 1.2 },
  subHead: { fontWeight: "bold", fontSize: 9, marginTop: 8, marginBottom: 4, color: colours.ledger },
  factRow: { flexDirection: "row", paddingVertical: 1.6 },
  factLabel: { width: 172, color: colours.soft },
  factValue: { flex: 1 },
  table: { marginTop: 2 },
  headRow: {
    flexDirection: "row",
    backgroundColor: colours.ledgerTint,
    borderTopWidth: 0.8,
    borderTopColor: colours.ink,
    borderBottomWidth: 0.6,
    borderBottomColor: colours.ledger,
  },
  headCell: {
    paddingVertical: 3,
    paddingHorizontal: 3,
    fontWeight: "bold",
    fontSize: 7,
    lineHeight: 1.25,
    color: colours.ledger,
  },
  row: { flexDirection: "row", borderBottomWidth: 0.4, borderBottomColor: colours.hairline },
  totalRow: {
    flexDirection: "row",
    borderTopWidth: 0.8,
    borderTopColor: colours.ink,
    borderBottomWidth: 0.8,
    borderBottomColor: colours.ink,
  },
  cell: { paddingVertical: 2.4, paddingHorizontal: 3, fontSize: 7.5, lineHeight: 1.3 },
  right: { textAlign: "right" },
  callout: {
    borderLeftWidth: 2.5,
    borderLeftColor: colours.ledger,
    backgroundColor: colours.ledgerPale,
    paddingVertical: 5,
    paddingHorizontal: 8,
    marginVertical: 5,
  },
  warning: {
    borderLeftWidth: 2.5,
    borderLeftColor: colours.warn,
    backgroundColor: colours.warnTint,
    color: colours.warn,
    paddingVertical: 4,
    paddingHorizontal: 8,
    marginVertical: 3,
  },
  formula: { fontFamily: MONO, fontSize: 8, lineHeight: 1.3, marginVertical: 2 },
});

export type Style = Styles[string];
