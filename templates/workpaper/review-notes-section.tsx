/** Section 8: review notes, their answers and their clearance. */
import { Text, View } from "@react-pdf/renderer";
import { Section } from "./primitives";
import { colours, s } from "./styles";
import type { ReviewNote, WorkpaperData } from "./workpaper-data";
import { formatDateTime } from "@/lib/format/date";

function Note({ note }: { note: ReviewNote }) {
  const cleared = note.clearedAt !== null;
  return (
    <View
      style={{ flexDirection: "row", borderBottomWidth: 0.4, borderBottomColor: colours.hairline, paddingVertical: 4 }}
      wrap={false}
    >
      <Text style={[s.bold, { width: 22, color: colours.ledger }]}>{`R${note.number}`}</Text>
      <View style={{ flex: 1 }}>
        <Text>{note.text}</Text>
        <Text style={[s.faint, s.small]}>{`Raised by ${note.raisedBy}, ${formatDateTime(note.raisedAt)}`}</Text>
        {note.answers.map((a, i) => (
          <View key={i} style={{ marginTop: 2, paddingLeft: 8, borderLeftWidth: 1, borderLeftColor: colours.hairline }}>
            <Text>{a.text}</Text>
            <Text style={[s.faint, s.small]}>{`Answered by ${a.by}, ${formatDateTime(a.at)}`}</Text>
          </View>
        ))}
      </View>
      <View style={{ width: 150, alignItems: "flex-end" }}>
        <Text style={[s.bold, { color: cleared ? colours.ledger : colours.warn }]}>{cleared ? "Cleared" : "Open"}</Text>
        {cleared && (
          <Text
            style={[s.faint, s.small, s.right]}
          >{`${note.clearedBy ?? ""}, ${formatDateTime(note.clearedAt)}`}</Text>
        )}
      </View>
    </View>
  );
}

export function ReviewNotesSection({ data }: { data: WorkpaperData }) {
  const open = data.reviewNotes.filter((n) => n.clearedAt === null).length;
  return (
    <Section number="8" title="Review notes">
      {data.reviewNotes.length === 0 ? (
        <Text style={s.soft}>No review notes were raised.</Text>
      ) : (
        <View>
          <Text
            style={[s.soft, { marginBottom: 3 }]}
          >{`${data.reviewNotes.length} note${data.reviewNotes.length === 1 ? "" : "s"}, ${open} open.`}</Text>
          {data.reviewNotes.map((note) => (
            <Note key={note.number} note={note} />
          ))}
        </View>
      )}
    </Section>
  );
}
