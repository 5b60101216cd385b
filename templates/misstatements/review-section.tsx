/** Review notes and sign-offs of the summary. */
import { Text, View } from "@react-pdf/renderer";
import type { SummaryView } from "@/lib/misstatements/types";
import { Section, Table } from "../workpaper/primitives";
import { colours, s } from "../workpaper/styles";
import { formatDateTime } from "@/lib/format/date";

const clip = (v: string) => (v.length > 240 ? `${v.slice(0, 240)}…` : v);

function Box({ title, who }: { title: string; who: { name: string; role: string; at: string } | null }) {
  return (
    <View
      style={{
        flex: 1,
        borderTopWidth: 1.2,
        borderTopColor: who ? colours.ledger : colours.hairline,
        paddingTop: 5,
        marginRight: 14,
      }}
    >
      <Text style={[s.faint, { fontSize: 6.5, letterSpacing: 0.6 }]}>{title.toUpperCase()}</Text>
      {who ? (
        <View>
          <Text style={[s.bold, { fontSize: 9.5, marginTop: 2 }]}>{who.name}</Text>
          <Text style={s.soft}>{who.role}</Text>
          <Text style={s.soft}>{formatDateTime(who.at)}</Text>
        </View>
      ) : (
        <Text style={[s.soft, { marginTop: 2 }]}>Not signed off</Text>
      )}
    </View>
  );
}

export function ReviewSection({ view }: { view: SummaryView }) {
  const lock = view.review.lock;
  return (
    <View>
      <Section number="7" title="Review notes">
        {view.notes.length === 0 ? (
          <Text style={s.soft}>No review notes were raised.</Text>
        ) : (
          view.notes.map((n, i) => (
            <View
              key={n.id}
              style={{
                flexDirection: "row",
                borderBottomWidth: 0.4,
                borderBottomColor: colours.hairline,
                paddingVertical: 4,
              }}
              wrap={false}
            >
              <Text style={[s.bold, { width: 22, color: colours.ledger }]}>{`R${i + 1}`}</Text>
              <View style={{ flex: 1 }}>
                <Text>{n.text}</Text>
                <Text style={[s.faint, s.small]}>{`Raised by ${n.raisedBy}, ${formatDateTime(n.raisedAt)}`}</Text>
                {n.answer && (
                  <Text>{`Answer (${n.answeredBy ?? ""}, ${formatDateTime(n.answeredAt)}): ${n.answer}`}</Text>
                )}
              </View>
              <Text
                style={[
                  s.bold,
                  { width: 120, textAlign: "right", color: n.status === "cleared" ? colours.ledger : colours.warn },
                ]}
              >
                {n.status === "cleared"
                  ? `Cleared ${formatDateTime(n.clearedAt)}`
                  : n.status === "answered"
                    ? "Answered"
                    : "Open"}
              </Text>
            </View>
          ))
        )}
      </Section>
      <Section number="8" title="Sign-offs">
        <View style={{ flexDirection: "row" }} wrap={false}>
          <Box title="Prepared by" who={view.review.preparer} />
          <Box title="Reviewed by" who={view.review.reviewer} />
          <View
            style={{
              flex: 1,
              borderTopWidth: 1.2,
              borderTopColor: lock ? colours.ledger : colours.hairline,
              paddingTop: 5,
            }}
          >
            <Text style={[s.faint, { fontSize: 6.5, letterSpacing: 0.6 }]}>LOCKED</Text>
            {lock ? (
              <View>
                <Text style={[s.bold, { fontSize: 9.5, marginTop: 2 }]}>{lock.name}</Text>
                <Text style={s.soft}>{formatDateTime(lock.at)}</Text>
              </View>
            ) : (
              <Text style={[s.soft, { marginTop: 2 }]}>Not locked — this is a draft</Text>
            )}
          </View>
        </View>
        {view.review.staleSignOffs && (
          <Text style={[s.soft, { marginTop: 4 }]}>
            Earlier sign-offs were given to rows that have since changed; they no longer apply.
          </Text>
        )}
      </Section>
      <Section number="9" title="Audit trail of the summary">
        {view.trail.length === 0 ? (
          <Text style={s.soft}>No changes recorded.</Text>
        ) : (
          <Table
            columns={[
              { label: "When", width: 78 },
              { label: "Who", width: 80 },
              { label: "Action", width: 70 },
              { label: "Subject", width: 70 },
              { label: "Change", flex: 1, mono: true },
            ]}
            rows={view.trail.map((t) => ({
              cells: [
                formatDateTime(t.at),
                t.who,
                t.action,
                t.subject,
                `${t.before ? `${clip(t.before)} → ` : ""}${clip(t.after ?? "")}`,
              ],
            }))}
          />
        )}
      </Section>
    </View>
  );
}
