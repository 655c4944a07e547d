// The hot reads' answer caches (decision 192): each web process keeps the answers it sent with the
// team's change stamp, and its statement sends the data again only when the stamp moved. Held here:
// every table those statements read has the triggers that move the stamp; after every kind of
// write, the next read in each of two web processes equals the answer built without any cache;
// an answer never reaches another team, role or person; the caches are bounded; and a process
// really answers from its cache (with a trigger disabled by hand, it serves the kept answer).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq, sql } from "drizzle-orm";
import { Client, EMAILS, seedWorld } from "./helpers";
import { startWebProcess, type WebProcess } from "./web-process";
import { db } from "../../server/db/client";
import { benchTest, clip, member, shot, shotResult, stick, trainingSession, user } from "../../server/db/schema";
import { clipPageStatementText, clipPageText } from "../../server/entities/clip/repository";
import { readoutStatementText } from "../../server/entities/shot/readout";
import { shotListPage, shotListStatementText } from "../../server/entities/shot/list-page";
import { getReadout, shotListAnswer } from "../../server/readout/service";
import { HttpError } from "../../server/http/problem";
import { parseRole } from "../../server/entities/member/role";
import { answerCache } from "../../server/http/answer-cache";

let world: Awaited<ReturnType<typeof seedWorld>>;
let procs: WebProcess[] = [];
const readers: { proc: string; email: string; client: Client }[] = [];
let writer: Client;
const team = () => `/api/teams/${world.teamId}`;
const uid = (email: string) => world.users[email];

beforeAll(async () => {
  world = await seedWorld();
  procs = await Promise.all([startWebProcess("web-1"), startWebProcess("web-2")]);
  writer = await new Client(procs[0].url).signIn(EMAILS.coach);
  for (const [i, p] of procs.entries())
    for (const email of [EMAILS.coach, EMAILS.player]) readers.push({ proc: `web-${i + 1}`, email, client: await new Client(p.url).signIn(email) });
}, 180_000);
afterAll(async () => {
  await Promise.all(procs.map((p) => p.stop()));
});

const roleOf = async (email: string) => {
  const [m] = await db().select({ role: member.role }).from(member).where(and(eq(member.userId, uid(email)), eq(member.organizationId, world.teamId)));
  return m ? parseRole(m.role) : null;
};

/** The clips table (all of it, newest first) as built without any cache: the repository's statement with no stamp held. */
async function clipsTruth(email: string) {
  const role = await roleOf(email);
  if (!role) return { status: 404 };
  const a = { userId: uid(email), teamId: world.teamId, role };
  const r = await clipPageText(a, { playerId: role === "player" ? a.userId : undefined }, "created", "desc", 1, 100);
  return { status: 200, items: JSON.parse(r.items!), total: r.total };
}

/** The Shots page's opening page as built without any cache: its statement with no stamp held. */
async function shotsTruth(email: string) {
  const role = await roleOf(email);
  if (!role) return { status: 404 };
  const a = { userId: uid(email), teamId: world.teamId, role };
  return { status: 200, body: shotListAnswer(a, { page: 1, pageSize: 50 }, await shotListPage(a, {}, { limit: 50, offset: 0 })) };
}

/** One shot's readout as the service builds it without the text path or any cache. */
async function readoutTruth(email: string, shotId: string) {
  const role = await roleOf(email);
  if (!role) return { status: 404 };
  try {
    return { status: 200, body: JSON.parse(JSON.stringify(await getReadout({ userId: uid(email), teamId: world.teamId, role }, shotId))) };
  } catch (e) {
    if (e instanceof HttpError) return { status: e.status };
    throw e;
  }
}

const shots: string[] = [];

/** Every reader in both processes reads the clips table and each tracked shot: each answer equals the one built without a cache. */
async function allFresh(after: string) {
  for (const r of readers) {
    const list = await r.client.get(`${team()}/clips?pageSize=100`);
    const want = await clipsTruth(r.email);
    expect(list.status, `${after}: ${r.email} on ${r.proc}, clips`).toBe(want.status);
    if (want.status === 200) expect({ items: list.json.items, total: list.json.total }, `${after}: ${r.email} on ${r.proc}, clips`).toEqual({ items: want.items, total: want.total });
    const page = await r.client.get(`${team()}/readout/shots?page=1&pageSize=50`);
    const pageTruth = await shotsTruth(r.email);
    expect(page.status, `${after}: ${r.email} on ${r.proc}, Shots list`).toBe(pageTruth.status);
    if (pageTruth.status === 200) expect(page.json, `${after}: ${r.email} on ${r.proc}, Shots list`).toEqual(pageTruth.body);
    for (const s of shots) {
      const got = await r.client.get(`${team()}/readout/shots/${s}`);
      const truth = await readoutTruth(r.email, s);
      expect(got.status, `${after}: ${r.email} on ${r.proc}, shot`).toBe(truth.status);
      if (truth.status === 200) expect(got.json, `${after}: ${r.email} on ${r.proc}, shot`).toEqual(truth.body);
    }
  }
}

/** The tables a statement reads: the quoted names in its text that are tables. */
async function tablesOf(text: string) {
  const { rows } = await db().execute<{ name: string }>(sql`select table_name as name from information_schema.tables where table_schema = 'public'`);
  const names = new Set(rows.map((r) => r.name));
  return [...new Set([...text.matchAll(/"([a-z_]+)"/g)].map((m) => m[1]))].filter((n) => names.has(n)).sort();
}

describe("the change stamp (decision 192)", () => {
  it("every table the hot reads' statements read has the triggers that move it", async () => {
    const read = new Set([...(await tablesOf(clipPageStatementText())), ...(await tablesOf(readoutStatementText())), ...(await tablesOf(shotListStatementText()))]);
    // The stamp's own tables are what the statements read the stamp from; the shot tally changes
    // only inside a statement that writes shots (decision 190), whose own triggers move the stamp;
    // the Shots list reads the team's row of organization only as its one row (no column of it is
    // shown), and a team deleted takes its members with it (whose triggers move the stamp).
    for (const own of ["answer_change", "answer_stamp", "shot_tally", "organization"]) expect(read.delete(own), own).toBe(true);
    expect(read.size).toBeGreaterThanOrEqual(9);
    const { rows } = await db().execute<{ tbl: string; name: string; fn: string }>(
      sql`select c.relname as tbl, t.tgname as name, p.proname as fn from pg_trigger t join pg_class c on c.oid = t.tgrelid join pg_proc p on p.oid = t.tgfoid where not t.tgisinternal and t.tgenabled <> 'D'`,
    );
    for (const tbl of read) {
      const mine = rows.filter((r) => r.tbl === tbl && r.fn.startsWith("answer_changed")).map((r) => r.name).sort();
      // A person's name is the only column of "user" these reads show.
      expect(mine, tbl).toEqual(tbl === "user" ? ["answer_change_name"] : ["answer_change_delete", "answer_change_insert", "answer_change_update"]);
    }
  });

  it("after every kind of write, the next read in each of two web processes is fresh", async () => {
    const player = uid(EMAILS.player);
    const [session] = await db().insert(trainingSession).values({ teamId: world.teamId, date: "2026-02-14", venue: "Lakeport Arena", drill: "Wrist shots" }).returning();
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "Ravens 85", ownerId: player, ratedFlex: 85 }).returning();
    const [c1] = await db()
      .insert(clip)
      .values({ teamId: world.teamId, captureFps: 240, originalName: "a.mp4", title: "First", status: "ready", framesDone: 60, frameCount: 60, width: 1280, height: 720, playerId: player, sessionId: session.id, stickId: st.id })
      .returning();
    await allFresh("the start");

    const steps: [string, () => Promise<unknown>][] = [
      ["a new clip", () => db().insert(clip).values({ teamId: world.teamId, captureFps: 240, originalName: "b.mp4", title: "Second", status: "extracting", framesDone: 3, frameCount: 60, playerId: player })],
      ["a clip's progress and status", () => db().update(clip).set({ framesDone: 60, status: "ready" }).where(eq(clip.title, "Second"))],
      ["a clip's title through the API", async () => expect((await writer.patch(`${team()}/clips/${c1.id}`, { title: "First, renamed" })).status).toBe(200)],
      ["a shot created through the API", async () => {
        const r = await writer.post(`${team()}/clips/${c1.id}/shots`, { frameStart: 1, frameEnd: 30 });
        expect(r.status, r.text).toBe(201);
        shots.push(r.json.id);
      }],
      ["a shot's stick", () => db().update(shot).set({ stickId: st.id }).where(eq(shot.id, shots[0]))],
      ["a shot's marks (as saving marks or accepting tracking does)", () => db().update(shot).set({ marks: { puck: [{ frame: 3, x: 10, y: 20 }] }, version: sql`${shot.version} + 1` }).where(eq(shot.id, shots[0]))],
      ["stored results (a recompute)", () => db().update(shotResult).set({ engineVersion: "test", error: "Mark the puck in two more frames.", shotVersion: 2, computedAt: new Date() }).where(eq(shotResult.shotId, shots[0]))],
      ["results recomputing", () => db().update(shotResult).set({ recomputeRequestedAt: new Date() }).where(eq(shotResult.shotId, shots[0]))],
      ["published to its player (review)", () => db().update(shot).set({ publishedAt: new Date(), publishedBy: uid(EMAILS.coach) }).where(eq(shot.id, shots[0]))],
      ["shared with the staff through the API", async () => expect((await writer.post(`${team()}/readout/shots/${shots[0]}/shares`, { player: false, staff: true })).status).toBe(201)],
      ["a stick's label", () => db().update(stick).set({ label: "Ravens 85, cut" }).where(eq(stick.id, st.id))],
      ["a bench test of the stick", () => db().insert(benchTest).values({ teamId: world.teamId, stickId: st.id, testedOn: "2026-01-10", spanMm: 1000, loadPointMm: 500, readings: [], fit: {}, measuredFlex: 92, eiNm2: 120, createdBy: uid(EMAILS.coach) })],
      ["a session's venue", () => db().update(trainingSession).set({ venue: "Lakeport Arena, rink 2" }).where(eq(trainingSession.id, session.id))],
      ["a person's name", () => db().update(user).set({ name: "Theo M. Renamed" }).where(eq(user.id, player))],
      ["taken back from its player", async () => expect((await writer.del(`${team()}/readout/shots/${shots[0]}/publication`)).status).toBe(200)],
      ["a player made analyst", () => db().update(member).set({ role: "analyst" }).where(and(eq(member.userId, player), eq(member.organizationId, world.teamId)))],
      ["and player again", () => db().update(member).set({ role: "player" }).where(and(eq(member.userId, player), eq(member.organizationId, world.teamId)))],
      ["a member removed", () => db().delete(member).where(and(eq(member.userId, player), eq(member.organizationId, world.teamId)))],
      ["and back", () => db().insert(member).values({ id: crypto.randomUUID(), organizationId: world.teamId, userId: player, role: "player", createdAt: new Date() })],
      ["a shot deleted through the API", async () => expect((await writer.del(`${team()}/shots/${shots[0]}`)).status).toBe(204)],
      ["a clip deleted through the API", async () => expect((await writer.del(`${team()}/clips/${c1.id}`)).status).toBe(204)],
    ];
    for (const [what, write] of steps) {
      await write();
      await allFresh(`after ${what}`);
    }
  }, 120_000);

  it("a process answers from its cache: with a trigger disabled by hand, it serves the kept answer", async () => {
    const [s] = await db().insert(trainingSession).values({ teamId: world.teamId, date: "2026-02-20", venue: "Old rink", drill: "" }).returning();
    await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, originalName: "c.mp4", title: "Cached", status: "ready", playerId: uid(EMAILS.player), sessionId: s.id });
    const coach = readers.find((r) => r.proc === "web-1" && r.email === EMAILS.coach)!.client;
    const venue = async () => (await coach.get(`${team()}/clips?pageSize=100`)).json.items.find((x: { title: string }) => x.title === "Cached").session.venue;
    // Read twice: an answer is kept from its ask's second read (decision 200).
    expect(await venue()).toBe("Old rink");
    expect(await venue()).toBe("Old rink");
    await db().execute(sql`alter table training_session disable trigger answer_change_update`);
    try {
      await db().update(trainingSession).set({ venue: "New rink" }).where(eq(trainingSession.id, s.id));
      expect(await venue()).toBe("Old rink");
    } finally {
      await db().execute(sql`alter table training_session enable trigger answer_change_update`);
    }
    await db().update(trainingSession).set({ drill: "Slap shots" }).where(eq(trainingSession.id, s.id));
    expect(await venue()).toBe("New rink");
  });
});

describe("kept answers stay with their reader", () => {
  it("never reach another team, role or person, in one process", async () => {
    const proc = procs[0].url;
    const coach = readers.find((r) => r.proc === "web-1" && r.email === EMAILS.coach)!.client;
    const player2 = await new Client(proc).signIn(EMAILS.player2);
    // The coach's (cached) table holds clips of both players; each player sees only their own.
    await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, originalName: "p2.mp4", title: "Second player's", status: "ready", playerId: uid(EMAILS.player2) });
    for (let i = 0; i < 2; i++) expect((await coach.get(`${team()}/clips?pageSize=100`)).json.items.map((x: { title: string }) => x.title)).toContain("Second player's");
    for (const [c, email] of [[player2, EMAILS.player2], [readers.find((r) => r.proc === "web-1" && r.email === EMAILS.player)!.client, EMAILS.player]] as const) {
      const got = (await c.get(`${team()}/clips?pageSize=100`)).json;
      expect(got.items).toEqual((await clipsTruth(email)).items);
    }
    // One person in two teams: the same ask in each team answers with that team's clips.
    await db().insert(member).values({ id: crypto.randomUUID(), organizationId: world.otherTeamId, userId: uid(EMAILS.coach), role: "coach", createdAt: new Date() });
    await db().insert(clip).values({ teamId: world.otherTeamId, captureFps: 240, originalName: "o.mp4", title: "Other team's", status: "ready" });
    const theirs = (await coach.get(`/api/teams/${world.otherTeamId}/clips?pageSize=100`)).json.items.map((x: { title: string }) => x.title);
    const ours = (await coach.get(`${team()}/clips?pageSize=100`)).json.items.map((x: { title: string }) => x.title);
    expect(theirs).toEqual(["Other team's"]);
    expect(ours).not.toContain("Other team's");
  });

  it("go out as the same bytes, with their length in bytes and their ETag (304 while current)", async () => {
    await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, originalName: "é.mp4", title: "Équipe – été, 1ʳᵉ prise", status: "ready" });
    const coach = readers.find((r) => r.proc === "web-2" && r.email === EMAILS.coach)!.client;
    // The first two reads are built (an answer is kept from the second, decision 200), the third is the kept one.
    const first = await coach.get(`${team()}/clips?pageSize=100`);
    await coach.get(`${team()}/clips?pageSize=100`);
    const again = await coach.get(`${team()}/clips?pageSize=100`);
    expect(again.text).toBe(first.text);
    expect(first.text).toContain("Équipe – été, 1ʳᵉ prise");
    expect(Number(again.headers.get("content-length"))).toBe(Buffer.byteLength(again.text));
    expect(again.headers.get("etag")).toBe(first.headers.get("etag"));
    // As a browser revalidates (fetch given If-None-Match alone adds "Cache-Control: no-cache", WHATWG Fetch).
    const current = await coach.request("GET", `${team()}/clips?pageSize=100`, undefined, { headers: { "if-none-match": again.headers.get("etag")!, "cache-control": "max-age=0" } });
    expect(current.status).toBe(304);
    expect(current.text).toBe("");
  });

  it("are kept from their ask's second read, and bounded by their size", () => {
    const c = answerCache(100_000, 50);
    c.keep("once", "1", "x");
    expect(c.known("once")).toBeUndefined();
    expect(c.keep("once", "1", "y").body.toString()).toBe("y");
    expect(c.known("once")?.body.toString()).toBe("y");
    // An ask read once is forgotten after 50 other asks: its next read is a first one again.
    const d = answerCache(100_000, 50);
    d.keep("old", "1", "x");
    for (let i = 0; i < 50; i++) d.keep(`other${i}`, "1", "x");
    d.keep("old", "1", "x");
    expect(d.known("old")).toBeUndefined();
    for (let i = 0; i < 1000; i++) for (let read = 0; read < 2; read++) c.keep(`k${i}`, "1", "x".repeat(1000));
    expect(c.size().bytes).toBeLessThanOrEqual(100_000);
    expect(c.size().entries).toBeGreaterThan(10);
    expect(c.known("k999")?.body).toHaveLength(1000);
    expect(c.known("k0")).toBeUndefined();
  });
});
