// The shot visibility rule as one table, run against both of its forms: the SQL condition lists
// use (shotVisibleWhere) and the pure check one shot uses (canSeeShot). A ground added to the rule
// gets its rows here, and the two forms can never drift apart unnoticed.
import { beforeAll, describe, expect, it } from "vitest";
import { and, inArray } from "drizzle-orm";
import { seedWorld } from "./helpers";
import { db } from "../../server/db/client";
import { clip, shot, shotShare } from "../../server/db/schema";
import { canSeeShot, grounds, shotVisibleWhere } from "../../server/entities/shot/visibility";
import type { Actor } from "../../server/entities/member/role";

let world: Awaited<ReturnType<typeof seedWorld>>;
const shots: Record<string, { id: string; teamId: string; playerId: string | null; published: boolean; sharedWith: string[] }> = {};
const user = (email: string) => world.users[email]!;

beforeAll(async () => {
  world = await seedWorld();
  const p1 = user("player@ravens.example"), p2 = user("player2@ravens.example");
  const make = async (name: string, teamId: string, playerId: string | null, published: boolean, sharedWith: string[] = []) => {
    const [c] = await db().insert(clip).values({ teamId, captureFps: 240, status: "ready" }).returning({ id: clip.id });
    const [s] = await db().insert(shot).values({ teamId, clipId: c.id, playerId, label: name, publishedAt: published ? new Date() : null }).returning({ id: shot.id });
    for (const u of sharedWith) await db().insert(shotShare).values({ shotId: s.id, userId: u, teamId });
    shots[name] = { id: s.id, teamId, playerId, published, sharedWith };
  };
  await make("player's own", world.teamId, p1, true);
  await make("player's own, in review", world.teamId, p1, false);
  await make("another player's", world.teamId, p2, true);
  await make("another player's, shared with player", world.teamId, p2, true, [p1]);
  await make("another player's, shared with player, in review", world.teamId, p2, false, [p1]);
  await make("nobody's", world.teamId, null, false);
  await make("other team's, same player id", world.otherTeamId, p1, true, [p1]);
});

const actor = (email: string, role: Actor["role"], team: "own" | "other" = "own"): Actor => ({
  userId: user(email), teamId: team === "own" ? world.teamId : world.otherTeamId, role,
});

// Who sees what: [actor, shots they see]. Every other shot of the table is hidden from them.
// Staff see shots in review; players (and teammates a shot is shared with) only once published.
const everyOwnTeamShot = ["player's own", "player's own, in review", "another player's", "another player's, shared with player", "another player's, shared with player, in review", "nobody's"];
const table: [string, () => Actor, string[]][] = [
  ["team admin", () => actor("admin@ravens.example", "admin"), everyOwnTeamShot],
  ["coach", () => actor("coach@ravens.example", "coach"), everyOwnTeamShot],
  ["analyst", () => actor("analyst@ravens.example", "analyst"), everyOwnTeamShot],
  ["player", () => actor("player@ravens.example", "player"), ["player's own", "another player's, shared with player"]],
  ["second player", () => actor("player2@ravens.example", "player"), ["another player's", "another player's, shared with player"]],
  ["player acting in the other team", () => actor("player@ravens.example", "player", "other"), ["other team's, same player id"]],
  ["coach acting in the other team", () => actor("coach@ravens.example", "coach", "other"), ["other team's, same player id"]],
];

describe("shot visibility: one table, both forms", () => {
  it("names its grounds", () => expect(grounds.map((g) => g.means).length).toBeGreaterThanOrEqual(3));

  it.each(table)("%s", async (_who, who, expected) => {
    const a = who();
    const all = Object.values(shots).map((s) => s.id);
    const viaSql = (await db().select({ id: shot.id }).from(shot).where(and(inArray(shot.id, all), shotVisibleWhere(a)))).map((r) => r.id);
    const viaCheck = Object.values(shots).filter((s) => canSeeShot(a, s)).map((s) => s.id);
    const names = (ids: string[]) => Object.entries(shots).filter(([, s]) => ids.includes(s.id)).map(([n]) => n).sort();
    expect(names(viaSql)).toEqual([...expected].sort());
    expect(names(viaCheck)).toEqual([...expected].sort());
  });
});
