import "server-only";
import { hasAtLeastRole, type EngagementRole } from "@/lib/auth/roles";
import { forbidden } from "@/lib/errors";

/**
 * Who may add or remove evidence on the team: staff and above; viewers only read. The client's
 * staff never reach these routes (client contacts get 404): they supply files through request
 * lists, and a file becomes evidence when the team accepts it (lib/requests/files.ts).
 */
export function mayWriteEvidence(role: EngagementRole): boolean {
  return hasAtLeastRole(role, "staff");
}

export function assertMayWriteEvidence(role: EngagementRole) {
  if (!mayWriteEvidence(role))
    throw forbidden(`Adding or removing evidence needs the staff role or above; you are ${role}.`);
}
