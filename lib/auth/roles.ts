/** Engagement roles from least to most authority. */
export const ENGAGEMENT_ROLES = ["viewer", "staff", "senior", "manager", "partner"] as const;
export type EngagementRole = (typeof ENGAGEMENT_ROLES)[number];

/**
 * The client's own staff: members of one engagement who see only the request lists addressed to
 * them. Deliberately outside ENGAGEMENT_ROLES, so no rank comparison can ever let them in.
 */
export const CLIENT_ROLE = "client" as const;
export type MembershipRole = EngagementRole | typeof CLIENT_ROLE;

/** Firm grades: an auditor's position, which sets what they may create before they join an engagement. */
export const GRADES = ["staff", "senior", "manager", "partner", "client"] as const;
export type Grade = (typeof GRADES)[number];

/** Grades as people say them. */
export const GRADE_LABELS: Record<Grade, string> = {
  staff: "Staff",
  senior: "Senior",
  manager: "Manager",
  partner: "Partner",
  client: "Client contact",
};

export const FIRM_ROLES = ["admin", "member"] as const;
export type FirmRole = (typeof FIRM_ROLES)[number];

export function roleRank(role: EngagementRole): number {
  return ENGAGEMENT_ROLES.indexOf(role);
}

/** True when `role` carries at least the authority of `leastRole`. */
export function hasAtLeastRole(role: EngagementRole, leastRole: EngagementRole): boolean {
  return roleRank(role) >= roleRank(leastRole);
}

/** Only managers and partners open engagements (they become the engagement's first reviewer). */
export function gradeMayCreateEngagement(grade: Grade): boolean {
  return grade === "manager" || grade === "partner";
}

/** The membership a grade gets by default when added to an engagement: client staff become client contacts. */
export function defaultRoleForGrade(grade: Grade): MembershipRole {
  return grade === "client" ? CLIENT_ROLE : grade;
}

export const ROLE_LABELS: Record<EngagementRole, string> = {
  viewer: "Viewer",
  staff: "Staff",
  senior: "Senior",
  manager: "Manager",
  partner: "Partner",
};
