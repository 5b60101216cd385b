import { renderEmail } from "./layout";
import { engagementLabel, type RenderedEmail, type SampleEventData } from "./types";
import { formatDateTime } from "@/lib/format/date";

export interface ReviewNoteAnsweredData extends SampleEventData {
  note: { text: string };
  answer: { text: string };
}

/** Sent to the reviewer who raised a note when the preparer answers it. */
export function reviewNoteAnswered(d: ReviewNoteAnsweredData): RenderedEmail {
  const label = engagementLabel(d.engagement);
  return renderEmail({
    subject: `Review note answered: ${d.sample.name} (${d.engagement.clientName})`,
    preview: `${d.actor.name} answered your review note on ${d.sample.name}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      { kind: "paragraph", text: `${d.actor.name} answered a review note on the sample "${d.sample.name}".` },
      { kind: "quote", label: "The note", text: d.note.text },
      { kind: "quote", label: `${d.actor.name} answered`, text: d.answer.text },
      {
        kind: "facts",
        rows: [
          ["Engagement", label],
          ["Sample", d.sample.name],
          ["Answered", formatDateTime(d.at)],
        ],
      },
      { kind: "paragraph", text: "Clear the note if the answer settles it, or reply to keep it open." },
    ],
    action: { label: "Review the answer", url: d.sampleUrl },
    judgementCaution: true,
    footer: `You receive this because you raised this note on ${label} in Sondage.`,
  });
}
