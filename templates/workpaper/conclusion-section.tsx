/** Section 7: the auditor's conclusion, with the caution that it rests on their judgement. */
import { Text, View } from "@react-pdf/renderer";
import { formatTime } from "./format";
import { CAUTION } from "./page-frame";
import { Paragraph, Section } from "./primitives";
import { colours, s } from "./styles";
import type { WorkpaperData } from "./workpaper-data";

export function ConclusionSection({ data }: { data: WorkpaperData }) {
  const c = data.conclusion;
  const verdict =
    c.supported === null ? "Not yet concluded" : c.supported ? "Supported by the evaluation" : "Not supported by the evaluation";
  const tone = c.supported === null ? colours.faint : c.supported ? colours.ledger : colours.warn;
  return (
    <Section number="7" title="Conclusion" keepTogether>
      <View style={{ flexDirection: "row", marginBottom: 4 }}>
        <Text style={[s.bold, { color: tone }]}>{verdict}</Text>
        {c.concludedBy && <Text style={s.faint}>{`  ·  ${c.concludedBy}, ${formatTime(c.concludedAt)}`}</Text>}
      </View>
      <Paragraph>{c.text ?? "No conclusion has been recorded yet."}</Paragraph>
      <View style={{ borderWidth: 0.8, borderColor: colours.ledger, padding: 7, marginTop: 4 }}>
        <Text style={[s.bold, { color: colours.ledger, fontSize: 7.5, marginBottom: 2 }]}>CAUTION</Text>
        <Text>{CAUTION}</Text>
      </View>
    </Section>
  );
}
