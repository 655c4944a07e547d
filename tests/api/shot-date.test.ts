// A shot's date is one rule (server/entities/shot/date.ts): its clip's session date, else the
// day its clip was uploaded. Every page that shows a shot's date must say the same day. Before the
// rule lived in one place the stick page used the day the shot was digitised instead.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { eq } from "drizzle-orm";
import { db } from "../../server/db/client";
import { clip, shot, stick, trainingSession } from "../../server/db/schema";
import { shotDate } from "../../server/entities/shot/date";
import { pageIdsQuery } from "../../server/entities/shot/readout";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
const T = () => `/api/teams/${world.teamId}`;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(() => srv.close());

async function shotWith(o: { sessionDate?: string; clipUploaded: string; shotCreated: string }) {
  const [s] = await db().insert(stick).values({ teamId: world.teamId, label: `Date stick ${Math.random()}`, ratedFlex: 85 }).returning();
  const sessionId = o.sessionDate
    ? (await db().insert(trainingSession).values({ teamId: world.teamId, date: o.sessionDate, venue: "Lakeport Arena" }).returning())[0].id
    : null;
  const [c] = await db()
    .insert(clip)
    .values({ teamId: world.teamId, captureFps: 240, status: "ready", sessionId, createdAt: new Date(o.clipUploaded), stickId: s.id })
    .returning();
  const [sh] = await db()
    .insert(shot)
    .values({ teamId: world.teamId, clipId: c.id, stickId: s.id, label: "Dated", createdAt: new Date(o.shotCreated), updatedAt: new Date(o.shotCreated) })
    .returning();
  return { shotId: sh.id, stickId: s.id };
}

async function datesShown(x: { shotId: string; stickId: string }) {
  const readout = await coach.get(`${T()}/readout/shots/${x.shotId}`);
  const list = await coach.get(`${T()}/readout/shots?stickId=${x.stickId}&page=1&pageSize=50`);
  const stickPage = await coach.get(`${T()}/sticks/${x.stickId}`);
  return {
    readout: readout.json.shot.date,
    shotsList: list.json.shots.find((s: any) => s.id === x.shotId)?.date,
    stickPageShots: stickPage.json.shots.find((s: any) => s.id === x.shotId)?.date,
    stickPageHistory: stickPage.json.shotsByDate.map((d: any) => d.date),
  };
}

/**
 * The query's plan with sorting and whole-table reads priced out: only an index that holds the
 * order avoids a Sort node then.
 */
async function planWithoutSort(q: { sql: string; params: unknown[] }): Promise<string> {
  const c = await db().pool.connect();
  try {
    await c.query("begin");
    await c.query("set local enable_sort = off");
    await c.query("set local enable_seqscan = off");
    return JSON.stringify((await c.query(`explain (format json) ${q.sql}`, q.params)).rows[0]["QUERY PLAN"]);
  } finally {
    await c.query("rollback");
    c.release();
  }
}

describe("a shot's date is the same on every page", () => {
  it("without a session: the day the clip was uploaded, not the day the shot was digitised", async () => {
    const x = await shotWith({ clipUploaded: "2026-03-01T18:30:00Z", shotCreated: "2026-03-04T09:00:00Z" });
    expect(await datesShown(x)).toEqual({ readout: "2026-03-01", shotsList: "2026-03-01", stickPageShots: "2026-03-01", stickPageHistory: ["2026-03-01"] });
  });

  it("with a session: the session's date, as written", async () => {
    const x = await shotWith({ sessionDate: "2026-02-27", clipUploaded: "2026-03-01T18:30:00Z", shotCreated: "2026-03-04T09:00:00Z" });
    expect(await datesShown(x)).toEqual({ readout: "2026-02-27", shotsList: "2026-02-27", stickPageShots: "2026-02-27", stickPageHistory: ["2026-02-27"] });
  });
});

// The date is stored (shot.shot_date, decision 173) so the Shots list reads in index order;
// PostgreSQL keeps it by the same rule on every write that can change it.
describe("the stored shot date", () => {
  /** The stored date beside the rule applied to the row as read now. */
  async function storedAndRule(shotId: string) {
    const [r] = await db()
      .select({ stored: shot.shotDate, sessionDate: trainingSession.date, clipCreatedAt: clip.createdAt })
      .from(shot).innerJoin(clip, eq(clip.id, shot.clipId)).leftJoin(trainingSession, eq(trainingSession.id, clip.sessionId))
      .where(eq(shot.id, shotId));
    return { stored: r.stored, rule: shotDate(r) };
  }

  it("follows a session's date corrected, a clip moved to another session, a session deleted; nothing else can set it", async () => {
    // Uploaded in the evening in Vancouver: already the next day by UTC.
    const x = await shotWith({ sessionDate: "2026-02-10", clipUploaded: "2026-03-01T23:30:00-08:00", shotCreated: "2026-03-04T09:00:00Z" });
    expect(await storedAndRule(x.shotId)).toEqual({ stored: "2026-02-10", rule: "2026-02-10" });
    const [{ clipId }] = await db().select({ clipId: shot.clipId }).from(shot).where(eq(shot.id, x.shotId));
    const [{ sessionId }] = await db().select({ sessionId: clip.sessionId }).from(clip).where(eq(clip.id, clipId));

    await db().update(trainingSession).set({ date: "2026-02-12" }).where(eq(trainingSession.id, sessionId!));
    expect(await storedAndRule(x.shotId)).toEqual({ stored: "2026-02-12", rule: "2026-02-12" });

    // Through the API, as the Clip page does it: the clip goes to a new session of another day.
    const moved = await coach.patch(`${T()}/clips/${clipId}`, { newSession: { date: "2026-01-05", venue: "Lakeport Arena", drill: "Point shots" } });
    expect(moved.status, moved.text).toBe(200);
    expect(await storedAndRule(x.shotId)).toEqual({ stored: "2026-01-05", rule: "2026-01-05" });
    expect((await coach.get(`${T()}/readout/shots/${x.shotId}`)).json.shot.date).toBe("2026-01-05");

    // The session deleted: the clip has none, the upload day (by UTC) rules.
    const [{ now }] = await db().select({ now: clip.sessionId }).from(clip).where(eq(clip.id, clipId));
    await db().delete(trainingSession).where(eq(trainingSession.id, now!));
    expect(await storedAndRule(x.shotId)).toEqual({ stored: "2026-03-02", rule: "2026-03-02" });

    await db().update(shot).set({ shotDate: "1999-01-01", label: "Tampered" }).where(eq(shot.id, x.shotId));
    expect(await storedAndRule(x.shotId)).toEqual({ stored: "2026-03-02", rule: "2026-03-02" });
  });

  it("the Shots list's page is read from an index in its order, not sorted", async () => {
    const coachActor = { userId: world.users[EMAILS.coach], teamId: world.teamId, role: "coach" as const };
    for (const f of [{}, { playerId: world.users[EMAILS.player] }]) {
      const plan = await planWithoutSort(pageIdsQuery(coachActor, f, { limit: 50, offset: 0 }).toSQL());
      expect(plan, JSON.stringify(f)).not.toMatch(/"Node Type":"(Sort|Incremental Sort)"/);
      expect(plan).toMatch(/shot_team_(newest|player)_idx/);
    }
  });
});

// The clip's shot type is stored on the shot as well (decision 176), so the Shots list filtered by
// type reads one index; PostgreSQL keeps it equal to the clip's on every write that can change it.
describe("the stored shot type", () => {
  const typeOf = async (shotId: string) =>
    (await db().select({ stored: shot.shotType, clips: clip.shotType }).from(shot).innerJoin(clip, eq(clip.id, shot.clipId)).where(eq(shot.id, shotId)))[0];

  it("is the clip's when the shot is made, follows the clip's type corrected through the API and a shot moved to another clip; nothing else can set it", async () => {
    const x = await shotWith({ clipUploaded: "2026-03-01T18:30:00Z", shotCreated: "2026-03-04T09:00:00Z" });
    const [{ clipId }] = await db().select({ clipId: shot.clipId }).from(shot).where(eq(shot.id, x.shotId));
    await db().update(clip).set({ shotType: "wrist" }).where(eq(clip.id, clipId));
    expect(await typeOf(x.shotId)).toEqual({ stored: "wrist", clips: "wrist" });

    // As the Clip page corrects it.
    const patched = await coach.patch(`${T()}/clips/${clipId}`, { shotType: "backhand" });
    expect(patched.status, patched.text).toBe(200);
    expect(await typeOf(x.shotId)).toEqual({ stored: "backhand", clips: "backhand" });
    const listed = await coach.get(`${T()}/readout/shots?stickId=${x.stickId}&shotType=backhand&page=1&pageSize=50`);
    expect(listed.json.shots.map((s: any) => s.id)).toEqual([x.shotId]);
    expect(listed.json.total).toBe(1);
    expect((await coach.get(`${T()}/readout/shots?stickId=${x.stickId}&shotType=wrist&page=1&pageSize=50`)).json.total).toBe(0);

    // Moved to a snap-shot clip.
    const [other] = await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, status: "ready", shotType: "snap" }).returning();
    await db().update(shot).set({ clipId: other.id }).where(eq(shot.id, x.shotId));
    expect(await typeOf(x.shotId)).toEqual({ stored: "snap", clips: "snap" });

    await db().update(shot).set({ shotType: "slap" }).where(eq(shot.id, x.shotId));
    expect(await typeOf(x.shotId)).toEqual({ stored: "snap", clips: "snap" });
  });

  it("the list filtered by type is read from its own index in order, and its count needs no clip", async () => {
    const coachActor = { userId: world.users[EMAILS.coach], teamId: world.teamId, role: "coach" as const };
    const plan = await planWithoutSort(pageIdsQuery(coachActor, { shotType: "wrist" }, { limit: 50, offset: 0 }).toSQL());
    expect(plan).not.toMatch(/"Node Type":"(Sort|Incremental Sort)"/);
    expect(plan).toMatch(/shot_team_type_idx/);
    expect(plan).not.toMatch(/"Relation Name":"clip"/);
  });
});
