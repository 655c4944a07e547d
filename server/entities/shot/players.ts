// Whose shots a clip holds, and moving them to another player. The shot visibility rule
// (./visibility.ts) reads shot.player_id on every request, so a move is who-sees-what at once:
// there is no copy of it to bring up to date.
import { and, count, eq, isNull, type SQL } from "drizzle-orm";
import { db } from "../../db/client";
import { shot } from "../../db/schema";

type Executor = Pick<ReturnType<typeof db>, "select" | "update">;

/** The clip's shots of `playerId` (null: the shots with no player), which follow the clip's player. */
const ofClipPlayer = (clipId: string, playerId: string | null): SQL =>
  and(eq(shot.clipId, clipId), playerId === null ? isNull(shot.playerId) : eq(shot.playerId, playerId))!;

export async function countClipShotsOf(clipId: string, playerId: string | null, executor: Executor = db()): Promise<number> {
  const [row] = await executor.select({ n: count() }).from(shot).where(ofClipPlayer(clipId, playerId));
  return row?.n ?? 0;
}

/** Moves the clip's shots of `from` to `to`; returns how many moved. Pass the caller's transaction. */
export async function moveClipShots(executor: Executor, clipId: string, from: string | null, to: string): Promise<number> {
  const moved = await executor.update(shot).set({ playerId: to, updatedAt: new Date() }).where(ofClipPlayer(clipId, from)).returning({ id: shot.id });
  return moved.length;
}
