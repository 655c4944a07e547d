// What a club's subscription state means for its teams. Pure, so the whole table is unit-tested.
//   ok        — everything works (free plan, or a paid plan in good standing)
//   grace     — a renewal failed: everything still works, admins are asked to pay, until graceEndsAt
//   read_only — grace is over (or the service gave up collecting: "unpaid"): nothing can be added
//               or changed, everything stays readable, nothing is ever deleted; paying restores it.
export type Access = "ok" | "grace" | "read_only";

export interface ClubBillingState {
  subscriptionStatus: string | null;
  pastDueSince: Date | null;
}

export function graceEndsAt(c: ClubBillingState, graceDays: number): Date | null {
  if (!c.pastDueSince) return null;
  return new Date(c.pastDueSince.getTime() + graceDays * 24 * 3600_000);
}

export function accessOf(c: ClubBillingState, now: Date, graceDays: number): Access {
  if (c.subscriptionStatus === "unpaid") return "read_only";
  if (c.subscriptionStatus === "past_due") {
    const end = graceEndsAt(c, graceDays);
    return end && now >= end ? "read_only" : "grace";
  }
  return "ok";
}
