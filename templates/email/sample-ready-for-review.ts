import { renderEmail } from "./layout";
import { engagementLabel, type RenderedEmail, type SampleEventData } from "./types";
import { formatDateTime } from "@/lib/format/date";

export type SampleReadyForReviewData = SampleEventData;

/** Sent to the engagement's reviewers when the preparer marks a sample ready for review. */
export function sampleReadyForReview(d: SampleReadyForReviewData): RenderedEmail {
  const label = engagementLabel(d.engagement);
  return renderEmail({
    subject: `Ready for review: ${d.sample.name} (${d.engagement.clientName})`,
    preview: `${d.actor.name} sent ${d.sample.name} for your review.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      { kind: "paragraph", text: `${d.actor.name} marked the sample "${d.sample.name}" ready for review.` },
      {
        kind: "facts",
        rows: [
          ["Engagement", label],
          ["Sample", d.sample.name],
          ["Sent by", `${d.actor.name}, ${formatDateTime(d.at)}`],
        ],
      },
      {
        kind: "paragraph",
        text: "Review the selections, the audited values and the evaluation, then raise notes or sign off.",
      },
    ],
    action: { label: "Review the sample", url: d.sampleUrl },
    judgementCaution: true,
    footer: `You receive this because you review ${label} in Sondage.`,
  });
}
