import { isStaff, type Actor } from "../entities/member/role";
import { canSeeShot, type ShotAccess } from "../entities/shot/visibility";

// The one authorization policy. Pure functions over (actor, resource): no I/O, so every route
// asks the same question the same way and the whole table is unit-tested without a server.
// A team admin can do everything a coach can (VOCABULARY.md: admin manages the team itself).

export { isStaff, type Actor };

/** What a shot-like resource exposes to the policy. */
export type OwnedResource = ShotAccess;
/** A clip: its player sees it, and anyone who reaches it through a shot they may see. */
export type ClipAccess = { teamId: string; playerId: string | null; sharedWith?: readonly string[] };
const sameTeam = (a: Actor, r: { teamId: string }) => a.teamId === r.teamId;

export const policy = {
  manageRoster: (a: Actor) => a.role === "admin",
  viewAuditLog: (a: Actor) => a.role === "admin",
  manageTeamSettings: (a: Actor) => a.role === "admin",
  /** The club's plan, payments and invoices, and new teams in the club. */
  manageBilling: (a: Actor) => a.role === "admin",
  viewMembers: (a: Actor) => isStaff(a),

  uploadClip: (a: Actor) => isStaff(a),
  listClips: (a: Actor) => isStaff(a),
  viewClip: (a: Actor, c: ClipAccess) => sameTeam(a, c) && (isStaff(a) || c.playerId === a.userId || (c.sharedWith ?? []).includes(a.userId)),
  editClip: (a: Actor, c: { teamId: string }) => sameTeam(a, c) && isStaff(a),
  deleteClip: (a: Actor, c: { teamId: string }) => sameTeam(a, c) && (a.role === "admin" || a.role === "coach" || a.role === "analyst"),

  /** The shot entity's one visibility rule (server/entities/shot/visibility.ts). */
  viewShot: (a: Actor, s: ShotAccess) => canSeeShot(a, s),
  editShot: (a: Actor, s: { teamId: string }) => sameTeam(a, s) && isStaff(a),
  shareShot: (a: Actor, s: { teamId: string }) => sameTeam(a, s) && (a.role === "admin" || a.role === "coach"),
  /** The review step: a coach (or team admin) decides when a shot reaches its player. */
  publishShot: (a: Actor, s: { teamId: string }) => sameTeam(a, s) && (a.role === "admin" || a.role === "coach"),
  /** A player compares own shots; staff compare any two in the team. */
  compareShots: (a: Actor, x: OwnedResource, y: OwnedResource) =>
    x.teamId === y.teamId && policy.viewShot(a, x) && policy.viewShot(a, y),
  viewProgress: (a: Actor, playerId: string) => isStaff(a) || playerId === a.userId,

  viewStick: (a: Actor, s: { teamId: string; ownerId: string | null }) => sameTeam(a, s) && (isStaff(a) || s.ownerId === a.userId),
  editStick: (a: Actor, s: { teamId: string }) => sameTeam(a, s) && isStaff(a),
  runBenchTest: (a: Actor, s: { teamId: string }) => sameTeam(a, s) && isStaff(a),
} as const;

export type PolicyAction = keyof typeof policy;
