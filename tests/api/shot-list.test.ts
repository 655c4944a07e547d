// The Shots list at its edges: who sees what on every page and filter, totals that stay exact
// through every write that moves a shot between them (the tally PostgreSQL keeps, decision 190),
// two writers at once, and the page answered in one statement (decision 191).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertShotWithResults } from "./routes/readout";
import { db } from "../../server/db/client";
import { member, shot, shotShare, stick, user } from "../../server/db/schema";
import { canSeeShot } from "../../server/entities/shot/visibility";
import type { Actor } from "../../server/entities/member/role";
import * as svc from "../../server/readout/service";
import { sql } from "drizzle-orm";
import { createAccount } from "../../server/auth/accounts";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client, player: Client, admin: Client;
const sticks: string[] = [];
const uid = (email: string) => world.users[email]!;
const R = () => `/api/teams/${world.teamId}/readout`;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  [coach, player, admin] = await Promise.all([EMAILS.coach, EMAILS.player, EMAILS.admin].map((e) => new Client(srv.url).signIn(e)));
  for (const label of ["List stick A", "List stick B"]) sticks.push((await db().insert(stick).values({ teamId: world.teamId, label, ratedFlex: 85 }).returning())[0].id);
  const p1 = uid(EMAILS.player), p2 = uid(EMAILS.player2);
  // Every combination the filters tell apart, some in review, some without results.
  let k = 0;
  for (const playerId of [p1, p2, null])
    for (const stickId of [sticks[0], sticks[1], null])
      for (const shotType of ["slap", "wrist"] as const) {
        k++;
        await insertShotWithResults({ teamId: world.teamId, playerId, stickId, shotType, label: `List ${k}`, published: k % 3 !== 0, uncalibrated: k % 4 === 0, sessionDate: `2026-0${(k % 9) + 1}-1${k % 10}` });
      }
  // Shared with player 1: one published, one still in review (which they must not see).
  const p2Shots = await db().select({ id: shot.id, publishedAt: shot.publishedAt }).from(shot).where(sql`${shot.teamId} = ${world.teamId} and ${shot.playerId} = ${p2}`);
  for (const s of [p2Shots.find((x) => x.publishedAt), p2Shots.find((x) => !x.publishedAt)])
    await db().insert(shotShare).values({ shotId: s!.id, userId: p1, teamId: world.teamId, sharedBy: uid(EMAILS.coach) });
  await insertShotWithResults({ teamId: world.otherTeamId, playerId: p1, label: "Other team's" });
});
afterAll(() => srv.close());

/** Keys where the tally and a count of the shots disagree (none, when the tally is right). */
async function tallyDrift() {
  // (Keys compared as text: a join on a null player or stick would never match.)
  const r = await db().execute(sql`
    with t as (select concat_ws('/', team_id, coalesce(player_id, '-'), coalesce(stick_id::text, '-'), shot_type, published) as k, n from shot_tally where n <> 0),
         s as (select concat_ws('/', team_id, coalesce(player_id, '-'), coalesce(stick_id::text, '-'), shot_type, published_at is not null) as k, count(*)::int as n from shot group by 1)
    select k, t.n as tally, s.n as shots from t full join s using (k) where t.n is distinct from s.n`);
  return r.rows;
}

type Filter = { playerId?: string; stickId?: string; shotType?: "slap" | "wrist" | "backhand"; review?: "published" | "waiting" };

/** What the list must hold: the team's shots in the list's order that the pure rule lets the viewer see, filtered. */
async function expected(a: Actor, f: Filter) {
  const rows = await db().execute<{ id: string; team_id: string; player_id: string | null; stick_id: string | null; shot_type: string; published_at: string | null; has_results: boolean; shared: string[] }>(sql`
    select s.id, s.team_id, s.player_id, s.stick_id, s.shot_type, s.published_at,
      exists (select 1 from shot_result r where r.shot_id = s.id and r.results is not null) as has_results,
      array(select user_id from shot_share h where h.shot_id = s.id) as shared
    from shot s where s.team_id = ${a.teamId} order by s.shot_date desc, s.clip_created_at desc, s.created_at desc, s.id`);
  return rows.rows
    .filter((s) => canSeeShot(a, { teamId: s.team_id, playerId: s.player_id, published: s.published_at !== null, sharedWith: s.shared }))
    .filter((s) => (!f.playerId || s.player_id === f.playerId) && (!f.stickId || s.stick_id === f.stickId) && (!f.shotType || s.shot_type === f.shotType))
    .filter((s) => (f.review === "published" ? s.published_at !== null : f.review === "waiting" ? s.published_at === null && s.has_results : true))
    .map((s) => s.id);
}

/** Every page of the list, pageSize 4, until a page comes back empty; each page's total. */
async function allPages(c: Client, f: Filter) {
  const q = new URLSearchParams(Object.entries(f).filter(([, v]) => v) as [string, string][]);
  const ids: string[] = [];
  const totals = new Set<number>();
  for (let page = 1; page < 50; page++) {
    const r = await c.get(`${R()}/shots?${q}&pageSize=4&page=${page}`);
    expect(r.status).toBe(200);
    totals.add(r.json.total);
    if (!r.json.shots.length) break;
    ids.push(...r.json.shots.map((s: { id: string }) => s.id));
  }
  return { ids, totals: [...totals] };
}

const coachActor = (): Actor => ({ userId: uid(EMAILS.coach), teamId: world.teamId, role: "coach" });
const playerActor = (): Actor => ({ userId: uid(EMAILS.player), teamId: world.teamId, role: "player" });

describe("the Shots list", () => {
  const filters = (): [string, Filter][] => [
    ["no filter", {}],
    ["player 1", { playerId: uid(EMAILS.player) }],
    ["player 2", { playerId: uid(EMAILS.player2) }],
    ["stick A", { stickId: sticks[0] }],
    ["wrist shots", { shotType: "wrist" }],
    ["published", { review: "published" }],
    ["waiting for review", { review: "waiting" }],
    ["player 2, stick B, slap, published", { playerId: uid(EMAILS.player2), stickId: sticks[1], shotType: "slap", review: "published" }],
  ];

  it("every filter and page, for staff and for a player: exactly the shots the rule lets them see, in order, once each, with the same exact total on every page", async () => {
    for (const [who, c, a] of [["coach", coach, coachActor()], ["player", player, playerActor()]] as const)
      for (const [name, f] of filters()) {
        const want = await expected(a, f);
        const got = await allPages(c, f);
        expect({ who, name, ids: got.ids, totals: got.totals }).toEqual({ who, name, ids: want, totals: [want.length] });
        // The page as the Shots page opens it (its own statement, decision 191) says the same.
        const q = new URLSearchParams(Object.entries(f).filter(([, v]) => v) as [string, string][]);
        const opening = (await c.get(`${R()}/shots?${q}&page=1&pageSize=50`)).json;
        expect({ who, name, ids: opening.shots.map((s: { id: string }) => s.id), total: opening.total }).toEqual({ who, name, ids: want.slice(0, 50), total: want.length });
      }
    // The player sees their own published shots and the one published shot shared with them.
    const seen = await allPages(player, {});
    expect(seen.ids.length).toBe(5);
  });

  it("checks membership in its own statement: a coach made a player sees only what a player may on the very next read, a removed member gets 404, a bad query 422 only for members", async () => {
    const email = "list.hotread@ravens.example";
    const { userId } = await createAccount({ email, password: DEMO_PASSWORD, name: "Lee Listread", emailVerified: true, signIn: false });
    await db().insert(member).values({ id: crypto.randomUUID(), organizationId: world.teamId, userId, role: "coach", createdAt: new Date() });
    const c = await new Client(srv.url).signIn(email);
    const setRole = (role: string) => db().update(member).set({ role }).where(sql`${member.userId} = ${userId} and ${member.organizationId} = ${world.teamId}`);
    const as = (role: Actor["role"]): Actor => ({ userId, teamId: world.teamId, role });
    expect((await allPages(c, {})).ids).toEqual(await expected(as("coach"), {}));
    await setRole("player");
    const asPlayer = await allPages(c, {});
    expect(asPlayer).toEqual({ ids: [], totals: [0] });
    await setRole("coach");
    expect((await allPages(c, {})).ids).toEqual(await expected(as("coach"), {}));
    expect((await c.get(`${R()}/shots?pageSize=nonsense`)).status).toBe(422);
    await db().delete(member).where(sql`${member.userId} = ${userId} and ${member.organizationId} = ${world.teamId}`);
    const gone = await c.get(`${R()}/shots?pageSize=50`);
    expect(gone.status).toBe(404);
    expect(gone.text).not.toContain("List 1");
    expect((await c.get(`${R()}/shots?pageSize=nonsense`)).status).toBe(404);
    expect((await new Client(srv.url).get(`${R()}/shots`)).status).toBe(401);
  });

  it("says who may see a shared shot: staff see how many it is shared with, the player that it was shared with them", async () => {
    const shared = (await player.get(`${R()}/shots?playerId=${uid(EMAILS.player2)}&pageSize=50`)).json;
    expect(shared.total).toBe(1);
    expect(shared.shots[0]).toMatchObject({ sharedWithMe: true, shareCount: 0 });
    const asCoach = (await coach.get(`${R()}/shots?pageSize=50&playerId=${uid(EMAILS.player2)}`)).json.shots.find((s: { id: string }) => s.id === shared.shots[0].id);
    expect(asCoach).toMatchObject({ sharedWithMe: false, shareCount: 1 });
  });

  it("is one statement to the database, and staff's total is read from the tally, not counted from the shots", async () => {
    const pool = db().pool;
    const texts: string[] = [];
    const query = pool.query.bind(pool);
    (pool as unknown as { query: unknown }).query = (cfg: string | { text: string }, ...rest: unknown[]) => {
      texts.push(typeof cfg === "string" ? cfg : cfg.text);
      return (query as (...a: unknown[]) => unknown)(cfg, ...rest);
    };
    let read: Awaited<ReturnType<typeof svc.listShots>> | undefined;
    try {
      read = await svc.listShots(coachActor(), { page: 1, pageSize: 50 });
    } finally {
      (pool as unknown as { query: unknown }).query = query;
    }
    // Membership is read in the same statement (decision 195).
    expect(read.storedRole).toBe("coach");
    expect(JSON.parse((await read.answer()).body.toString()).total).toBe((await expected(coachActor(), {})).length);
    expect(texts).toHaveLength(1);
    expect(texts[0]).toMatch(/from "shot_tally"/);
  });
});

describe("the tally behind the totals", () => {
  const total = async (f: Filter = {}) => (await coach.get(`${R()}/shots?${new URLSearchParams(f as Record<string, string>)}&pageSize=1`)).json.total as number;
  const count = async (where = sql`true`) => Number((await db().execute<{ n: string }>(sql`select count(*) as n from shot where team_id = ${world.teamId} and ${where}`)).rows[0].n);

  it("stays exact through every write that moves a shot between totals", async () => {
    const steps: [string, () => Promise<unknown>][] = [];
    const f = await insertShotWithResults({ teamId: world.teamId, playerId: uid(EMAILS.player), stickId: sticks[0], label: "Moving", published: false });
    const made = await coach.post(`/api/teams/${world.teamId}/clips/${f.clipId}/shots`, { frameStart: 10, frameEnd: 200 });
    expect(made.status).toBe(201);
    const gone = await insertShotWithResults({ teamId: world.teamId, playerId: null, label: "To delete" });
    const [leaver] = await db().insert(user).values({ id: crypto.randomUUID(), name: "Leaving Player", email: `leaver-${Date.now()}@ravens.example`, emailVerified: true }).returning();
    await db().insert(member).values({ id: crypto.randomUUID(), organizationId: world.teamId, userId: leaver.id, role: "player", createdAt: new Date() });
    await insertShotWithResults({ teamId: world.teamId, playerId: leaver.id, label: "Leaver's" });
    const [spare] = await db().insert(stick).values({ teamId: world.teamId, label: "Spare stick", ratedFlex: 75 }).returning();
    const spareShot = await insertShotWithResults({ teamId: world.teamId, stickId: spare.id, label: "On the spare stick" });
    steps.push(
      ["a shot made through the API", async () => made],
      ["its player changed", () => coach.patch(`/api/teams/${world.teamId}/shots/${f.shotId}`, { playerId: uid(EMAILS.player2) })],
      ["its stick taken off", () => coach.patch(`/api/teams/${world.teamId}/shots/${f.shotId}`, { stickId: null })],
      ["published", () => coach.put(`${R()}/shots/${f.shotId}/publication`, { notify: false })],
      ["taken back to review", () => coach.del(`${R()}/shots/${f.shotId}/publication`)],
      ["its clip's shot type corrected", () => coach.patch(`/api/teams/${world.teamId}/clips/${f.clipId}`, { shotType: "backhand" })],
      ["every waiting shot published by auto-publish", () => admin.patch(`${R()}/settings`, { autoPublish: true })],
      ["a shot deleted", () => coach.del(`/api/teams/${world.teamId}/shots/${gone.shotId}`)],
      ["a clip deleted with its shots", () => coach.del(`/api/teams/${world.teamId}/clips/${f.clipId}`)],
      ["a stick deleted", () => coach.del(`/api/teams/${world.teamId}/sticks/${spare.id}`)],
      ["a player's account deleted (their shots keep no player)", () => db().delete(user).where(sql`${user.id} = ${leaver.id}`)],
    );
    for (const [name, write] of steps) {
      const r = (await write()) as { status?: number } | undefined;
      if (r && typeof r.status === "number") expect({ name, status: r.status < 300 }).toEqual({ name, status: true });
      expect({ name, drift: await tallyDrift() }).toEqual({ name, drift: [] });
      expect({ name, total: await total() }).toEqual({ name, total: await count() });
      expect({ name, backhand: await total({ shotType: "backhand" }) }).toEqual({ name, backhand: await count(sql`shot_type = 'backhand'`) });
      expect({ name, published: await total({ review: "published" }) }).toEqual({ name, published: await count(sql`published_at is not null`) });
    }
    expect(spareShot.shotId).toBeTruthy();
    // A team deleted with its shots leaves nothing counted for it.
    await db().execute(sql`delete from organization where id = ${world.otherTeamId}`);
    expect(await tallyDrift()).toEqual([]);
  });

  it("two writers at once, one waiting on the other's tally rows, and a rolled-back writer: the tally counts what committed", async () => {
    const url = process.env.DATABASE_URL!;
    const [a, b, c] = [new pg.Client({ connectionString: url }), new pg.Client({ connectionString: url }), new pg.Client({ connectionString: url })];
    await Promise.all([a.connect(), b.connect(), c.connect()]);
    try {
      const p1 = uid(EMAILS.player), p2 = uid(EMAILS.player2);
      const base = await insertShotWithResults({ teamId: world.teamId, playerId: p1, label: "Writers' template" });
      const copy = (who: string, label: string) =>
        `insert into shot (team_id, clip_id, player_id, label, published_at) values ('${world.teamId}', '${base.clipId}', '${who}', '${label}', now())`;
      const before = await count();
      const [x] = (await db().select({ id: shot.id }).from(shot).where(sql`${shot.teamId} = ${world.teamId} and ${shot.playerId} = ${p1}`).limit(1));
      const [y] = (await db().select({ id: shot.id }).from(shot).where(sql`${shot.teamId} = ${world.teamId} and ${shot.playerId} = ${p2}`).limit(1));
      await a.query("begin");
      await b.query("begin");
      await c.query("begin");
      await a.query(copy(p1, "Writer A 1"));
      await a.query(`update shot set player_id = '${p2}' where id = '${x.id}'`);
      // B writes the same keys: it waits on A's tally rows until A commits.
      const bWrites = (async () => {
        await b.query(copy(p1, "Writer B 1"));
        await b.query(`update shot set player_id = '${p1}' where id = '${y.id}'`);
        await b.query(copy(p1, "Writer B 2"));
      })();
      // C writes keys nobody else does (or A would wait on C's new tally row until C ends).
      await c.query(copy(uid(EMAILS.analyst), "Rolled back"));
      await new Promise((r) => setTimeout(r, 200)); // B is now blocked (no timing is asserted)
      await a.query("commit");
      await bWrites;
      await b.query("commit");
      await c.query("rollback");
      expect(await count()).toBe(before + 3);
      expect(await tallyDrift()).toEqual([]);
      expect(await total()).toBe(before + 3);
      expect(await total({ playerId: p1 })).toBe(await count(sql`player_id = ${p1}`));
    } finally {
      await Promise.all([a.end(), b.end(), c.end()]);
    }
  });
});
