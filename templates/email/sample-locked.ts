import { renderEmail } from "./layout";
import { engagementLabel, type RenderedEmail, type SampleEventData } from "./types";
import { formatDateTime } from "@/lib/format/date";

export type SampleLockedData = SampleEventData;

/** Sent to the sample's team when a manager or partner signs it off and locks it. */
export function sampleLocked(d: SampleLockedData): RenderedEmail {
  const label = engagementLabel(d.engagement);
  return renderEmail({
    subject: `Locked: ${d.sample.name} (${d.engagement.clientName})`,
    preview: `${d.actor.name} signed off and locked ${d.sample.name}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: `${d.actor.name} signed off and locked the sample "${d.sample.name}". Its selections, audited values and evaluation can no longer be changed, and its workpaper is final.`,
      },
      {
        kind: "facts",
        rows: [
          ["Engagement", label],
          ["Sample", d.sample.name],
          ["Locked by", `${d.actor.name}, ${formatDateTime(d.at)}`],
        ],
      },
    ],
    action: { label: "Open the locked sample", url: d.sampleUrl },
    judgementCaution: true,
    footer: `You receive this because you are on the team of ${label} in Sondage.`,
  });
}
