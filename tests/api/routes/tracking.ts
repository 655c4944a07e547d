import type { RouteCase } from "../route-table";
import { shotFixture } from "./shots";

const ALL = ["admin", "coach", "analyst", "player"] as const;
const STAFF = ["admin", "coach", "analyst"] as const;

/** Rows of the policy table for auto-digitise (see tests/api/route-table.ts). */
export const trackingRoutes: RouteCase[] = [
  { name: "latest tracking run of a shot", method: "GET", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}/tracking`, allowed: ALL, teamScoped: true, fixture: shotFixture },
  {
    name: "start tracking", method: "POST", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}/tracking`, body: () => ({ seedFrame: 1, seeds: { puck: [600, 600] } }),
    allowed: STAFF, teamScoped: true, fixture: shotFixture,
  },
  { name: "cancel tracking", method: "DELETE", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}/tracking`, allowed: STAFF, teamScoped: true, fixture: shotFixture },
];
