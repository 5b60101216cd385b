/**
 * Section 7: the result as computed by Sondage (with its rule), apart from the auditor's own
 * conclusion and response (who wrote them and when), and the caution that the result supports,
 * not replaces, the auditor's judgement. Prints the view model as it is.
 */
import { Text, View } from "@react-pdf/renderer";
import { CAUTION } from "./page-frame";
import { Paragraph, Section, SubHead } from "./primitives";
import { colours, s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";
import { formatMoney } from "@/lib/format/number";
import { formatDateTime } from "@/lib/format/date";

const VERDICT = {
  supported: "Supports the recorded amount",
  "not-supported": "Does not support the recorded amount",
  provisional: "Provisional",
  "no-results": "No results yet",
  "not-evaluable": "Not evaluable yet",
} as const;

export function ConclusionSection({ data }: { data: WorkpaperData }) {
  const c = data.conclusion;
  const tone = c.computed.supported === null ? colours.faint : c.computed.supported ? colours.ledger : colours.warn;
  return (
    <Section number="7" title="Result and conclusion" keepTogether>
      <SubHead>Computed by Sondage</SubHead>
      <Text style={[s.bold, { color: tone, marginBottom: 2 }]}>{VERDICT[c.computed.status]}</Text>
      <Paragraph>{c.computed.statement}</Paragraph>
      {c.computed.rule !== "" && (
        <Text style={[s.small, s.soft, { marginBottom: 3 }]}>{`Rule: ${c.computed.rule}`}</Text>
      )}
      {c.notes.map((n, i) => (
        <Text key={i} style={[s.small, s.soft]}>
          {n}
        </Text>
      ))}
      <SubHead>{"Auditor's conclusion and response"}</SubHead>
      {c.auditor ? (
        <View>
          <Text
            style={s.faint}
          >{`Written by ${c.auditor.writtenBy} (${c.auditor.role}), ${formatDateTime(c.auditor.writtenAt)}`}</Text>
          <Paragraph>{c.auditor.conclusion}</Paragraph>
          {c.auditor.responses.length === 0 ? (
            <Text style={s.soft}>No response recorded (none called for by the computed result).</Text>
          ) : (
            c.auditor.responses.map((r, i) => (
              <Text
                key={i}
              >{`• ${r.label}${r.amount === null ? "" : `: ${data.currency} ${formatMoney(r.amount)}`}${r.note ? ` — ${r.note}` : ""}`}</Text>
            ))
          )}
        </View>
      ) : (
        <Paragraph>{"No auditor's conclusion has been recorded yet."}</Paragraph>
      )}
      <View style={{ borderWidth: 0.8, borderColor: colours.ledger, padding: 7, marginTop: 4 }}>
        <Text style={[s.bold, { color: colours.ledger, fontSize: 7.5, marginBottom: 2 }]}>CAUTION</Text>
        <Text>{CAUTION}</Text>
      </View>
    </Section>
  );
}
