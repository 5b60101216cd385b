import { renderEmail } from "./layout";
import { engagementLabel, type EngagementRef, type Person, type RenderedEmail } from "./types";
import { formatDate, formatDateTime } from "@/lib/format/date";

export interface EngagementInvitationData {
  recipient: Person;
  invitedBy: Person;
  /** The role on the engagement, e.g. "senior". */
  role: string;
  engagement: EngagementRef & { periodEnd: string };
  engagementUrl: string;
  addedAt: Date | string;
}

/** Sent to a person when a manager or partner adds them to an engagement's team. */
export function engagementInvitation(d: EngagementInvitationData): RenderedEmail {
  const label = engagementLabel(d.engagement);
  return renderEmail({
    subject: `You have been added to ${label}`,
    preview: `${d.invitedBy.name} added you to the team as ${d.role}.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      { kind: "paragraph", text: `${d.invitedBy.name} added you to the team of ${label} in Sondage, as ${d.role}.` },
      {
        kind: "facts",
        rows: [
          ["Client", d.engagement.clientName],
          ["Engagement", d.engagement.name],
          ["Period end", formatDate(d.engagement.periodEnd)],
          ["Your role", d.role],
          ["Added by", `${d.invitedBy.name}, ${formatDateTime(d.addedAt, "addedAt")}`],
        ],
      },
      {
        kind: "paragraph",
        text: "Sign in with your firm account to see the engagement's populations, samples and review notes.",
      },
    ],
    action: { label: "Open the engagement", url: d.engagementUrl },
    judgementCaution: false,
    footer: `You receive this because you were added to ${label}. Ask the engagement's manager if this was not meant for you.`,
  });
}
