// Every API route, with who may call it. The policy test runs each row as every role, as a
// member of another team, and signed out. Feature areas add their rows here.
import type { Role } from "../../shared/schemas/roster";
import type { Client } from "./helpers";

export interface Ctx {
  teamId: string;
  otherTeamId: string;
  /** Resources created by fixture(), by name. */
  ids: Record<string, string>;
  admin: Client;
  /** Demo user ids by e-mail (see server/seed/demo-people.ts). */
  users: Record<string, string>;
}

export interface RouteCase {
  name: string;
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  path: (c: Ctx) => string;
  body?: (c: Ctx) => unknown;
  /** Roles for which the call succeeds (2xx). Others must get 403 or 404. */
  allowed: readonly Role[];
  /** Runs before each call (as team admin) and returns ids the path needs. */
  fixture?: (c: Ctx) => Promise<Record<string, string>>;
  /** Team-scoped: a member of another team gets 404. */
  teamScoped?: boolean;
}

const ALL: Role[] = ["admin", "coach", "analyst", "player"];
const STAFF: Role[] = ["admin", "coach", "analyst"];
const ADMIN: Role[] = ["admin"];
let n = 0;
const fresh = (p: string) => `${p}-${Date.now()}-${n++}@ravens.example`;

async function invitationFixture(c: Ctx) {
  const r = await c.admin.post(`/api/teams/${c.teamId}/invitations`, { email: fresh("fx"), role: "player" });
  return { invitationId: r.json.id };
}
async function spareMemberFixture(c: Ctx) {
  // a member to change or remove: invite + accept as a new account
  const { Client } = await import("./helpers");
  const inv = (await c.admin.post(`/api/teams/${c.teamId}/invitations`, { email: fresh("spare"), role: "player" })).json;
  const joiner = new Client(c.admin.base);
  await joiner.post(`/api/invitations/${inv.id}/accept`, { name: "Spare Member", password: "spare-password-1" });
  const members = (await c.admin.get(`/api/teams/${c.teamId}/members`)).json.members;
  return { memberId: members.find((m: { email: string }) => m.email === inv.email).id };
}

import { clipsRoutes } from "./routes/clips";
import { shotsRoutes } from "./routes/shots";
import { trackingRoutes } from "./routes/tracking";
import { sticksRoutes } from "./routes/sticks";
import { readoutRoutes } from "./routes/readout";
import { billingRoutes } from "./routes/billing";

export const ALL_ROLES = ALL, STAFF_ROLES = STAFF, ADMIN_ONLY = ADMIN;

const coreRoutes: RouteCase[] = [
  { name: "me", method: "GET", path: () => "/api/me", allowed: ALL },
  { name: "prefs", method: "PATCH", path: () => "/api/me/prefs", body: () => ({ units: "metric" }), allowed: ALL },
  { name: "switch team", method: "PUT", path: () => "/api/me/active-team", body: (c) => ({ teamId: c.teamId }), allowed: ALL },
  { name: "roster", method: "GET", path: (c) => `/api/teams/${c.teamId}/members`, allowed: STAFF, teamScoped: true },
  { name: "invite", method: "POST", path: (c) => `/api/teams/${c.teamId}/invitations`, body: () => ({ email: fresh("inv"), role: "player" }), allowed: ADMIN, teamScoped: true },
  { name: "resend invitation", method: "POST", path: (c) => `/api/teams/${c.teamId}/invitations/${c.ids.invitationId}/resend`, allowed: ADMIN, teamScoped: true, fixture: invitationFixture },
  { name: "cancel invitation", method: "DELETE", path: (c) => `/api/teams/${c.teamId}/invitations/${c.ids.invitationId}`, allowed: ADMIN, teamScoped: true, fixture: invitationFixture },
  { name: "change role", method: "PATCH", path: (c) => `/api/teams/${c.teamId}/members/${c.ids.memberId}`, body: () => ({ role: "analyst" }), allowed: ADMIN, teamScoped: true, fixture: spareMemberFixture },
  { name: "remove member", method: "DELETE", path: (c) => `/api/teams/${c.teamId}/members/${c.ids.memberId}`, allowed: ADMIN, teamScoped: true, fixture: spareMemberFixture },
  { name: "home", method: "GET", path: (c) => `/api/teams/${c.teamId}/home`, allowed: ALL, teamScoped: true },
  { name: "audit log", method: "GET", path: (c) => `/api/teams/${c.teamId}/audit`, allowed: ADMIN, teamScoped: true },
];

export const routeTable: RouteCase[] = [...coreRoutes, ...clipsRoutes, ...shotsRoutes, ...trackingRoutes, ...sticksRoutes, ...readoutRoutes, ...billingRoutes];
