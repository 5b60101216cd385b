/** Section 9: who prepared and who reviewed, and when the workpaper was locked. */
import { Text, View } from "@react-pdf/renderer";
import { Section } from "./primitives";
import { colours, s } from "./styles";
import type { SignOff, WorkpaperData } from "./workpaper-data";
import { formatDateTime } from "@/lib/format/date";

function Box({ title, signOff }: { title: string; signOff: SignOff | null }) {
  return (
    <View
      style={{
        flex: 1,
        borderTopWidth: 1.2,
        borderTopColor: signOff ? colours.ledger : colours.hairline,
        paddingTop: 5,
        marginRight: 14,
      }}
    >
      <Text style={[s.faint, { fontSize: 6.5, letterSpacing: 0.6 }]}>{title.toUpperCase()}</Text>
      {signOff ? (
        <View>
          <Text style={[s.bold, { fontSize: 9.5, marginTop: 2 }]}>{signOff.name}</Text>
          <Text style={s.soft}>{signOff.role}</Text>
          <Text style={s.soft}>{formatDateTime(signOff.at)}</Text>
        </View>
      ) : (
        <Text style={[s.soft, { marginTop: 2 }]}>Not signed off</Text>
      )}
    </View>
  );
}

export function SignOffsSection({ data }: { data: WorkpaperData }) {
  return (
    <Section number="9" title="Sign-offs">
      <View style={{ flexDirection: "row" }} wrap={false}>
        <Box title="Prepared by" signOff={data.signOffs.preparer} />
        <Box title="Reviewed by" signOff={data.signOffs.reviewer} />
        <View
          style={{
            flex: 1,
            borderTopWidth: 1.2,
            borderTopColor: data.lock ? colours.ledger : colours.hairline,
            paddingTop: 5,
          }}
        >
          <Text style={[s.faint, { fontSize: 6.5, letterSpacing: 0.6 }]}>LOCKED</Text>
          {data.lock ? (
            <View>
              <Text style={[s.bold, { fontSize: 9.5, marginTop: 2 }]}>{data.lock.lockedBy}</Text>
              <Text style={s.soft}>{data.lock.role}</Text>
              <Text style={s.soft}>{formatDateTime(data.lock.lockedAt)}</Text>
            </View>
          ) : (
            <Text style={[s.soft, { marginTop: 2 }]}>Not locked — this is a draft</Text>
          )}
        </View>
      </View>
    </Section>
  );
}
