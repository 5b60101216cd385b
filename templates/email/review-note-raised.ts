import { renderEmail } from "./layout";
import { engagementLabel, type RenderedEmail, type SampleEventData } from "./types";
import { formatDateTime } from "@/lib/format/date";

export interface ReviewNoteRaisedData extends SampleEventData {
  note: { text: string };
}

/** Sent to the sample's preparers when a reviewer raises a review note on it. */
export function reviewNoteRaised(d: ReviewNoteRaisedData): RenderedEmail {
  const label = engagementLabel(d.engagement);
  return renderEmail({
    subject: `Review note on ${d.sample.name} (${d.engagement.clientName})`,
    preview: `${d.actor.name} raised a review note on ${d.sample.name}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      { kind: "paragraph", text: `${d.actor.name} raised a review note on the sample "${d.sample.name}".` },
      { kind: "quote", label: `${d.actor.name} wrote`, text: d.note.text },
      {
        kind: "facts",
        rows: [
          ["Engagement", label],
          ["Sample", d.sample.name],
          ["Raised", formatDateTime(d.at)],
        ],
      },
      { kind: "paragraph", text: "Answer the note in Sondage so the reviewer can clear it." },
    ],
    action: { label: "Answer the note", url: d.sampleUrl },
    judgementCaution: true,
    footer: `You receive this because you prepare work on ${label} in Sondage.`,
  });
}
