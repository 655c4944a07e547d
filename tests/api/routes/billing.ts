// Billing rows of the route table: every member sees the club's plan (for the banner); only a
// team admin reads invoices or adds a team to the club. Checkout and plan changes need the
// payments fake and are covered, role by role, in billing.test.ts.
import type { RouteCase } from "../route-table";

const ALL = ["admin", "coach", "analyst", "player"] as const;
let n = 0;

export const billingRoutes: RouteCase[] = [
  { name: "club plan", method: "GET", path: (c) => `/api/teams/${c.teamId}/billing`, allowed: ALL, teamScoped: true },
  { name: "invoices", method: "GET", path: (c) => `/api/teams/${c.teamId}/billing/invoices`, allowed: ["admin"], teamScoped: true },
  { name: "add a team to the club", method: "POST", path: (c) => `/api/teams/${c.teamId}/club/teams`, body: () => ({ name: `Ravens extra ${Date.now()}-${n++}` }), allowed: ["admin"], teamScoped: true },
];
