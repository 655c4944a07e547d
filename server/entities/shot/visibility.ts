// Who may see a shot — THE rule, written once. Each ground below says it twice, side by side: as
// an SQL condition over the `shot` row (for lists, counts and filter choices) and as a pure check
// over one shot already read (for a single shot, exports, compare, the beam). A shot is visible to
// a member of its own team on any one ground; never across teams. tests/api/shot-visibility.test.ts
// runs one table of cases against both forms.
//
// Adding a ground (say "published to the team"): add its column to ShotAccess, one entry to
// `grounds`, and rows to the table test. Nothing else in the server decides who sees a shot.
//
// Review before players see: a shot reaches its player, and teammates it is shared with, only once
// staff publish it (shot.published_at; a team may publish automatically once results exist).
// Unpublishing, or un-sharing, takes that access away again on the next request.
import { and, eq, isNotNull, or, sql, type SQL } from "drizzle-orm";
import { db } from "../../db/client";
import { shot, shotShare } from "../../db/schema";
import { isStaff, type Actor } from "../member/role";

/** What the rule reads of one shot. */
export interface ShotAccess {
  teamId: string;
  playerId: string | null;
  /** Published by staff (or by the team's auto-publish): only then do players see it. */
  published: boolean;
  /** Users the shot was explicitly shared with. */
  sharedWith?: readonly string[];
}

/** What the rule reads of a shot row (anything with the shot's columns) and its shares. */
export const shotAccess = (s: { teamId: string; playerId: string | null; publishedAt: Date | string | null }, sharedWith: readonly string[] = []): ShotAccess => ({
  teamId: s.teamId,
  playerId: s.playerId,
  published: s.publishedAt !== null,
  sharedWith,
});

interface Ground {
  /** What the ground means, in a coach's words (shown by the table test). */
  means: string;
  /** true: every shot of the team; false: none; else a condition on the `shot` row. */
  where: (a: Actor) => SQL | boolean;
  check: (a: Actor, s: ShotAccess) => boolean;
}

export const grounds: readonly Ground[] = [
  {
    means: "staff (team admin, coach, analyst) see every shot of their team",
    where: (a) => isStaff(a),
    check: (a) => isStaff(a),
  },
  {
    means: "a player sees the shots they took, once staff publish them",
    where: (a) => and(eq(shot.playerId, a.userId), isNotNull(shot.publishedAt))!,
    check: (a, s) => s.published && s.playerId === a.userId,
  },
  {
    means: "a teammate sees a published shot that staff shared with them",
    // The ids shared with the viewer as one array, looked up once: "own or shared" then reads the
    // (team, player) index and the primary key together (a bitmap OR) instead of testing every
    // shot of the team (scripts/bench/load.ts).
    where: (a) =>
      and(isNotNull(shot.publishedAt), sql`${shot.id} = any(array(${db().select({ id: shotShare.shotId }).from(shotShare).where(eq(shotShare.userId, a.userId))}))`)!,
    check: (a, s) => s.published && (s.sharedWith ?? []).includes(a.userId),
  },
];

/** The SQL condition: shots of the actor's team that the actor may see. */
export function shotVisibleWhere(a: Actor): SQL {
  const team = eq(shot.teamId, a.teamId);
  const conditions: SQL[] = [];
  for (const g of grounds) {
    const w = g.where(a);
    if (w === true) return team;
    if (w !== false) conditions.push(w);
  }
  return conditions.length ? and(team, or(...conditions))! : and(team, sql`false`)!;
}

/** The rule gives this viewer every shot of their team (staff): lists may then count the team's tally. */
export const seesWholeTeam = (a: Actor): boolean => grounds.some((g) => g.where(a) === true);

/** The pure check for one shot already read. */
export function canSeeShot(a: Actor, s: ShotAccess): boolean {
  return s.teamId === a.teamId && grounds.some((g) => g.check(a, s));
}
