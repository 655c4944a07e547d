// Stick lab rows: sticks, bench tests, the team's alert level, and the shots taken with a stick.
// Drizzle only; the rules live in service.ts. Every query names the team.
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { db } from "../../db/client";
import { benchTest, clip, shot, shotResult, shotShare, stick, trainingSession, user } from "../../db/schema";
import type { Actor } from "../member/role";
import { newestShotFirst, shotDateSql } from "../shot/date";
import { shotVisibleWhere } from "../shot/visibility";

export type StickRecord = typeof stick.$inferSelect;
export type BenchTestRecord = typeof benchTest.$inferSelect;
type StickValues = Omit<typeof stick.$inferInsert, "id" | "teamId" | "createdAt">;
type BenchTestValues = Omit<typeof benchTest.$inferInsert, "id" | "createdAt">;

export async function sticksOf(teamId: string, ownerId?: string) {
  return db()
    .select({ stick, ownerName: user.name })
    .from(stick)
    .leftJoin(user, eq(user.id, stick.ownerId))
    .where(ownerId === undefined ? eq(stick.teamId, teamId) : and(eq(stick.teamId, teamId), eq(stick.ownerId, ownerId)))
    .orderBy(asc(stick.label));
}

export async function stickById(teamId: string, stickId: string) {
  const [row] = await db()
    .select({ stick, ownerName: user.name })
    .from(stick)
    .leftJoin(user, eq(user.id, stick.ownerId))
    .where(and(eq(stick.teamId, teamId), eq(stick.id, stickId)));
  return row ?? null;
}

export async function stickByLabel(teamId: string, label: string) {
  const [row] = await db().select().from(stick).where(and(eq(stick.teamId, teamId), eq(stick.label, label)));
  return row ?? null;
}

export async function insertStick(teamId: string, values: StickValues) {
  const [row] = await db().insert(stick).values({ ...values, teamId }).returning();
  return row;
}

export async function updateStick(teamId: string, stickId: string, values: Partial<StickValues>) {
  const [row] = await db().update(stick).set(values).where(and(eq(stick.teamId, teamId), eq(stick.id, stickId))).returning();
  return row ?? null;
}

export async function deleteStick(teamId: string, stickId: string) {
  await db().delete(stick).where(and(eq(stick.teamId, teamId), eq(stick.id, stickId)));
}

export async function benchTestsOf(teamId: string, stickIds: readonly string[]) {
  if (stickIds.length === 0) return [];
  return db()
    .select({ test: benchTest, createdByName: user.name })
    .from(benchTest)
    .leftJoin(user, eq(user.id, benchTest.createdBy))
    .where(and(eq(benchTest.teamId, teamId), inArray(benchTest.stickId, [...stickIds])))
    .orderBy(asc(benchTest.testedOn), asc(benchTest.createdAt));
}

export async function benchTestById(teamId: string, stickId: string, testId: string) {
  const [row] = await db()
    .select({ test: benchTest, createdByName: user.name })
    .from(benchTest)
    .leftJoin(user, eq(user.id, benchTest.createdBy))
    .where(and(eq(benchTest.teamId, teamId), eq(benchTest.stickId, stickId), eq(benchTest.id, testId)));
  return row ?? null;
}

export async function insertBenchTest(values: BenchTestValues) {
  const [row] = await db().insert(benchTest).values(values).returning();
  return row;
}

export async function deleteBenchTest(teamId: string, testId: string) {
  await db().delete(benchTest).where(and(eq(benchTest.teamId, teamId), eq(benchTest.id, testId)));
}

const shotDay = shotDateSql;

/** Shots taken with each stick, for the list's counts. */
export async function shotCountsOf(teamId: string, stickIds: readonly string[]) {
  if (stickIds.length === 0) return new Map<string, number>();
  const rows = await db()
    .select({ stickId: shot.stickId, n: sql<number>`count(*)::int` })
    .from(shot)
    .where(and(eq(shot.teamId, teamId), inArray(shot.stickId, [...stickIds])))
    .groupBy(shot.stickId);
  return new Map(rows.map((r) => [r.stickId!, r.n]));
}

/** Shots with this stick per day, of those the actor may see. */
export async function shotsByDateOf(a: Actor, stickId: string) {
  return db()
    .select({ date: shotDay, count: sql<number>`count(*)::int` })
    .from(shot)
    .where(and(shotVisibleWhere(a), eq(shot.stickId, stickId)))
    .groupBy(shotDay)
    .orderBy(shotDay);
}

/** Shots with this stick that the actor may see, newest first. */
export async function shotsWithStick(a: Actor, stickId: string, limit = 50) {
  return db()
    .select({
      id: shot.id,
      label: shot.label,
      date: shotDay,
      playerId: shot.playerId,
      playerName: user.name,
      hasDeflection: sql<boolean>`coalesce(json_typeof(${shotResult.results} -> 'shaftDeflection') = 'object', false)`,
    })
    .from(shot)
    .leftJoin(user, eq(user.id, shot.playerId))
    .leftJoin(shotResult, eq(shotResult.shotId, shot.id))
    .where(and(shotVisibleWhere(a), eq(shot.stickId, stickId)))
    .orderBy(...newestShotFirst)
    .limit(limit);
}

/** The shots taken with the stick (of that team, when given: a request names it; a recompute job has only the stick). */
export async function shotIdsWithStick(stickId: string, teamId?: string) {
  const rows = await db()
    .select({ id: shot.id })
    .from(shot)
    .where(and(eq(shot.stickId, stickId), ...(teamId ? [eq(shot.teamId, teamId)] : [])));
  return rows.map((r) => r.id);
}

/** A shot with what the beam model needs: its stick, its stored results and who may see it. */
export async function shotForBeam(teamId: string, shotId: string) {
  const [row] = await db()
    .select({ shot, results: shotResult.results, resultError: shotResult.error, date: shotDay })
    .from(shot)
    .innerJoin(clip, eq(clip.id, shot.clipId))
    .leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
    .leftJoin(shotResult, eq(shotResult.shotId, shot.id))
    .where(and(eq(shot.teamId, teamId), eq(shot.id, shotId)));
  if (!row) return null;
  const shares = await db().select({ userId: shotShare.userId }).from(shotShare).where(eq(shotShare.shotId, shotId));
  return { ...row, sharedWith: shares.map((s) => s.userId) };
}

/** The stick's label when it is one of the team's sticks, else null. */
export async function stickLabel(teamId: string, stickId: string): Promise<string | null> {
  const [row] = await db().select({ label: stick.label }).from(stick).where(and(eq(stick.id, stickId), eq(stick.teamId, teamId)));
  return row?.label ?? null;
}

export async function stickInTeam(teamId: string, stickId: string) {
  return (await stickLabel(teamId, stickId)) !== null;
}
