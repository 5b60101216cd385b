import { describe, expect, it } from "vitest";
import { decideEngagementAccess, parseIdParam } from "@/lib/auth/access";
import {
  CLIENT_ROLE,
  defaultRoleForGrade,
  ENGAGEMENT_ROLES,
  hasAtLeastRole,
  type EngagementRole,
} from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";

function statusOf(fn: () => unknown): number | "allowed" {
  try {
    fn();
    return "allowed";
  } catch (err) {
    if (err instanceof AppError) return err.status;
    throw err;
  }
}

describe("decideEngagementAccess", () => {
  // Every role against every least role: allowed exactly when the role ranks at or above it.
  for (const role of ENGAGEMENT_ROLES) {
    for (const least of ENGAGEMENT_ROLES) {
      const expected = ENGAGEMENT_ROLES.indexOf(role) >= ENGAGEMENT_ROLES.indexOf(least) ? "allowed" : 403;
      it(`${role} on a route needing ${least} → ${expected}`, () => {
        expect(
          statusOf(() => decideEngagementAccess({ userId: 7, userActive: true, membershipRole: role }, least)),
        ).toBe(expected);
      });
    }
  }

  it("answers 401 without a session, whatever the membership", () => {
    for (const least of ENGAGEMENT_ROLES) {
      expect(
        statusOf(() => decideEngagementAccess({ userId: null, userActive: false, membershipRole: "partner" }, least)),
      ).toBe(401);
    }
  });

  it("answers 401 for a deactivated user even with a live session", () => {
    expect(
      statusOf(() => decideEngagementAccess({ userId: 7, userActive: false, membershipRole: "partner" }, "viewer")),
    ).toBe(401);
  });

  it("answers 404 — never 403, never access — to a client contact on every auditor route, even a viewer's", () => {
    for (const least of ENGAGEMENT_ROLES) {
      expect(
        statusOf(() => decideEngagementAccess({ userId: 7, userActive: true, membershipRole: "client" }, least)),
      ).toBe(404);
    }
  });

  it("keeps the client role outside the auditor ranks and maps client staff to it", () => {
    expect((ENGAGEMENT_ROLES as readonly string[]).includes(CLIENT_ROLE)).toBe(false);
    expect(defaultRoleForGrade("client")).toBe("client");
    expect(defaultRoleForGrade("senior")).toBe("senior");
  });

  it("answers 404, not 403, to a user who is not on the engagement", () => {
    for (const least of ENGAGEMENT_ROLES) {
      expect(statusOf(() => decideEngagementAccess({ userId: 7, userActive: true, membershipRole: null }, least))).toBe(
        404,
      );
    }
  });

  it("returns the member's role when allowed", () => {
    expect(decideEngagementAccess({ userId: 1, userActive: true, membershipRole: "senior" }, "staff")).toBe("senior");
  });

  it("names the needed and the actual role in the 403 message", () => {
    expect(() => decideEngagementAccess({ userId: 1, userActive: true, membershipRole: "staff" }, "manager")).toThrow(
      /manager role or above.*you are staff/,
    );
  });
});

describe("hasAtLeastRole", () => {
  it("orders viewer < staff < senior < manager < partner", () => {
    const order: EngagementRole[] = ["viewer", "staff", "senior", "manager", "partner"];
    order.forEach((role, i) => order.forEach((least, j) => expect(hasAtLeastRole(role, least)).toBe(i >= j)));
  });
});

describe("parseIdParam", () => {
  it("accepts positive integers", () => expect(parseIdParam("42", "engagement")).toBe(42));
  for (const bad of [undefined, "", "0", "-3", "1.5", "abc", "1e3", "99999999999"]) {
    it(`treats ${JSON.stringify(bad)} as not found`, () =>
      expect(statusOf(() => parseIdParam(bad, "engagement"))).toBe(404));
  }
});
