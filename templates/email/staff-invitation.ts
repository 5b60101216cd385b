import { renderEmail } from "./layout";
import type { Person, RenderedEmail } from "./types";

export interface StaffInvitationData {
  recipient: Person;
  invitedBy: Person;
  firmName: string;
  /** "new": a new account; "reset": the administrator asked for a new password (the old one no longer works). */
  reason: "new" | "reset";
  /** The one-time link to choose a password. */
  actionUrl: string;
  expiresInDays: number;
}

/** Sent to a member of the firm's staff: choose your own password with a one-time link (the administrator never sees it). */
export function staffInvitation(d: StaffInvitationData): RenderedEmail {
  const isNew = d.reason === "new";
  return renderEmail({
    subject: isNew ? `${d.firmName}: choose your Sondage password` : `${d.firmName}: choose a new Sondage password`,
    preview: isNew
      ? `${d.invitedBy.name} gave you an account in Sondage.`
      : `${d.invitedBy.name} asked for your password to be chosen again.`,
    greeting: `Hello ${d.recipient.name},`,
    blocks: [
      {
        kind: "paragraph",
        text: isNew
          ? `${d.invitedBy.name} gave you an account in ${d.firmName}'s Sondage workspace, where the audit team plans, draws and evaluates its samples.`
          : `${d.invitedBy.name} reset your Sondage password. Your previous password no longer works and any session you had open has ended.`,
      },
      {
        kind: "paragraph",
        text: `Choose your password with the link below. It works once and for ${d.expiresInDays} days.`,
      },
    ],
    action: { label: isNew ? "Choose your password" : "Choose a new password", url: d.actionUrl },
    judgementCaution: false,
    footer: `You receive this because ${d.invitedBy.name}, an administrator of ${d.firmName}, asked for it. If you do not expect it, tell them: nothing happens without the link.`,
  });
}
