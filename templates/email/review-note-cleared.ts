import { renderEmail } from "./layout";
import { engagementLabel, type RenderedEmail, type SampleEventData } from "./types";
import { formatDateTime } from "@/lib/format/date";

export interface ReviewNoteClearedData extends SampleEventData {
  note: { text: string };
}

/** Sent to the sample's preparers when the reviewer clears a note. */
export function reviewNoteCleared(d: ReviewNoteClearedData): RenderedEmail {
  const label = engagementLabel(d.engagement);
  return renderEmail({
    subject: `Review note cleared: ${d.sample.name} (${d.engagement.clientName})`,
    preview: `${d.actor.name} cleared a review note on ${d.sample.name}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      { kind: "paragraph", text: `${d.actor.name} cleared a review note on the sample "${d.sample.name}".` },
      { kind: "quote", label: "The note", text: d.note.text },
      {
        kind: "facts",
        rows: [
          ["Engagement", label],
          ["Sample", d.sample.name],
          ["Cleared by", `${d.actor.name}, ${formatDateTime(d.at)}`],
        ],
      },
    ],
    action: { label: "Open the sample", url: d.sampleUrl },
    judgementCaution: true,
    footer: `You receive this because you prepare work on ${label} in Sondage.`,
  });
}
