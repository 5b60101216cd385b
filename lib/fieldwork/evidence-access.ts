import "server-only";
import { hasAtLeastRole, type EngagementRole, type Grade } from "@/lib/auth/roles";
import { forbidden } from "@/lib/errors";

/**
 * Who may add or remove evidence: staff and above, and the client's own staff — a viewer whose
 * firm grade is "client" — because they are the ones who supply it. Other viewers only read.
 */
export function mayWriteEvidence(role: EngagementRole, grade: Grade): boolean {
  return hasAtLeastRole(role, "staff") || (role === "viewer" && grade === "client");
}

export function assertMayWriteEvidence(role: EngagementRole, grade: Grade) {
  if (!mayWriteEvidence(role, grade)) throw forbidden(`Adding or removing evidence needs the staff role or above (or a client contact's access); you are ${role}.`);
}

/** The client's staff remove only what they uploaded themselves; the audit team may remove any file. */
export function assertMayDeleteEvidence(role: EngagementRole, actorId: number, uploadedBy: number) {
  if (!hasAtLeastRole(role, "staff") && actorId !== uploadedBy) throw forbidden("Client contacts may remove only the evidence they uploaded themselves.");
}
