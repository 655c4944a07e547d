import { describe, expect, it } from "vitest";
import { accessOf, graceEndsAt } from "../../../server/billing/access";

const day = 24 * 3600_000;
const t0 = new Date("2026-12-01T12:00:00Z");

describe("what a club's subscription state means for its teams", () => {
  it.each([
    ["free plan, no subscription", null, null, 0, "ok"],
    ["active", "active", null, 0, "ok"],
    ["trialing", "trialing", null, 0, "ok"],
    ["renewal failed an hour ago", "past_due", t0, 1 / 24, "grace"],
    ["renewal failed 13.9 days ago", "past_due", t0, 13.9, "grace"],
    ["renewal failed exactly 14 days ago", "past_due", t0, 14, "read_only"],
    ["renewal failed 30 days ago", "past_due", t0, 30, "read_only"],
    ["the service gave up collecting", "unpaid", t0, 0, "read_only"],
    ["canceled (back on the free plan)", "canceled", null, 0, "ok"],
  ] as const)("%s → %s", (_label, status, since, daysLater, expected) => {
    const now = new Date(t0.getTime() + daysLater * day);
    expect(accessOf({ subscriptionStatus: status, pastDueSince: since }, now, 14)).toBe(expected);
  });

  it("the grace period ends grace-days after the first failure", () => {
    expect(graceEndsAt({ subscriptionStatus: "past_due", pastDueSince: t0 }, 14)?.toISOString()).toBe("2026-12-15T12:00:00.000Z");
    expect(graceEndsAt({ subscriptionStatus: "active", pastDueSince: null }, 14)).toBeNull();
  });
});
