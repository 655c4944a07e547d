// The plans a club can be on (names of our own). The limits here are the ones the server
// enforces; the monthly price is what the plan pages show — the amount actually charged is the
// payment service's price, which the server maps to a plan by its id (server/billing/prices.ts).
import { bytesText, GB, TB } from "../bytes";

export const PLAN_IDS = ["pond", "rink", "arena"] as const;
export type PlanId = (typeof PLAN_IDS)[number];

export interface Plan {
  id: PlanId;
  name: string;
  /** Cents per month; 0 for the free plan. */
  monthlyCents: number;
  currency: "usd";
  /** Clip storage shared by all the club's teams. */
  storageBytes: number;
  /** People in a staff role (team admin, coach, analyst) across the club; players are not counted. */
  staffSeats: number;
  teams: number;
  blurb: string;
}


export const PLANS: Record<PlanId, Plan> = {
  pond: { id: "pond", name: "Pond", monthlyCents: 0, currency: "usd", storageBytes: 5 * GB, staffSeats: 3, teams: 1, blurb: "Try Loadframe with one team." },
  rink: { id: "rink", name: "Rink", monthlyCents: 3900, currency: "usd", storageBytes: 250 * GB, staffSeats: 10, teams: 3, blurb: "A club with a few teams and its own coaches." },
  arena: { id: "arena", name: "Arena", monthlyCents: 9900, currency: "usd", storageBytes: TB, staffSeats: 40, teams: 12, blurb: "A whole program: every age group, a full staff." },
};

export const FREE_PLAN: PlanId = "pond";
export const isPaidPlan = (p: PlanId) => PLANS[p].monthlyCents > 0;

/** Storage as people read it (decimal units, as the limits count them). */
export const storageText = bytesText;

export const moneyText = (cents: number, currency = "usd") =>
  new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);

/** The payment service's price ids for the paid plans unless PAYMENTS_PRICE_RINK / _ARENA say otherwise (the fake offers these). */
export const DEFAULT_PRICE_IDS = { rink: "price_rink_monthly", arena: "price_arena_monthly" } as const;
