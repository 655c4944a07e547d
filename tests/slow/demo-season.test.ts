// The demo season (scripts/demo/season.ts, seeded by server/seed/season.ts) on a real database:
// its counts, its dates and times, results that came out of the pipeline close to the scenes'
// truth, the softening stick, clips in every state, and something on every role's pages. Slow
// tier: the seed renders, encodes and extracts about 45 clips (renders are cached in the OS temp
// folder, so a second run mostly extracts).
import { and, eq, inArray, isNotNull, isNull, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, startServer, type TestServer } from "../api/helpers";
import { seedDemo } from "../../server/seed";
import type { DemoIds } from "../../server/seed/demo-people";
import { db } from "../../server/db/client";
import { benchTest, clip, member, shot, shotResult, shotShare, stick, trainingSession, user } from "../../server/db/schema";
import { clipTruth } from "../../scripts/demo/render-scene";
import { seasonClips } from "../../scripts/demo/season";
import type { HomeResponse } from "../../shared/schemas/home";
import type { ProgressResponse } from "../../shared/schemas/readout";

let srv: TestServer;
let ids: DemoIds;
let teams: string[];

beforeAll(async () => {
  ids = await seedDemo({ season: true });
  teams = [ids.teamId, ids.secondTeamId];
  srv = await startServer();
}, 900_000);
afterAll(async () => srv?.close());

const count = (rows: unknown[]) => rows.length;
const localHour = (d: Date) => Number(new Intl.DateTimeFormat("en-GB", { timeZone: "America/Vancouver", hour: "2-digit", hourCycle: "h23" }).format(d));

describe("the demo season", () => {
  it("names every season clip once (the seed finds them by title)", () => {
    const titles = seasonClips.map((c) => `${c.team}:${c.title}`);
    expect(new Set(titles).size).toBe(titles.length);
  });

  it("has two teams, at least 12 players, and the analyst and the player sign-in in both teams", async () => {
    const rows = await db().select({ userId: member.userId, teamId: member.organizationId, role: member.role, email: user.email }).from(member).innerJoin(user, eq(user.id, member.userId)).where(inArray(member.organizationId, teams));
    expect(new Set(rows.map((r) => r.teamId)).size).toBe(2);
    expect(new Set(rows.filter((r) => r.role === "player").map((r) => r.userId)).size).toBeGreaterThanOrEqual(12);
    for (const team of teams) expect(rows.filter((r) => r.teamId === team && r.role === "player").length).toBeGreaterThanOrEqual(5);
    for (const email of ["analyst@ravens.example", "player@ravens.example"]) expect(new Set(rows.filter((r) => r.email === email).map((r) => r.teamId)).size, email).toBe(2);
  });

  it("has at least 8 sessions over two months or more, in different calendar weeks, filmed at sensible local times", async () => {
    const sessions = await db().selectDistinct({ id: trainingSession.id, date: trainingSession.date }).from(trainingSession).innerJoin(clip, eq(clip.sessionId, trainingSession.id)).where(inArray(trainingSession.teamId, teams));
    expect(sessions.length).toBeGreaterThanOrEqual(8);
    const days = sessions.map((s) => Date.parse(`${s.date}T00:00:00Z`) / 86_400_000).sort((a, b) => a - b);
    expect(days.at(-1)! - days[0]).toBeGreaterThanOrEqual(61);
    expect(new Set(days.map((d) => Math.floor((d - 4) / 7))).size).toBeGreaterThanOrEqual(8); // weeks from Monday (1970-01-05)
    const uploads = await db().select({ at: clip.createdAt }).from(clip).where(inArray(clip.teamId, teams));
    for (const u of uploads) expect(localHour(u.at), u.at.toISOString()).toBeGreaterThanOrEqual(8);
    const season = uploads.filter((u) => u.at < new Date("2026-11-26T00:00:00Z"));
    expect(season.length).toBeGreaterThan(30);
    for (const u of season) expect(localHour(u.at), u.at.toISOString()).toBeLessThanOrEqual(22);
  });

  it("has at least 120 shots with results, of all four shot types, close to the scenes' truth", async () => {
    const rows = await db()
      .select({ type: clip.shotType, title: clip.title, label: shot.label, summary: shotResult.summary })
      .from(shot).innerJoin(clip, eq(clip.id, shot.clipId)).innerJoin(shotResult, eq(shotResult.shotId, shot.id))
      .where(and(inArray(shot.teamId, teams), isNotNull(shotResult.results)));
    expect(rows.length).toBeGreaterThanOrEqual(120);
    const perType = Object.fromEntries(["slap", "wrist", "snap", "backhand"].map((t) => [t, rows.filter((r) => r.type === t).length]));
    for (const [t, n] of Object.entries(perType)) expect(n, t).toBeGreaterThanOrEqual(10);
    // Made by the engine from marks on real frames: each exit speed within 3 ± of its scene's (not typed in).
    let checked = 0;
    for (const c of seasonClips.filter((x) => x.state === "done")) {
      const truths = clipTruth(c.shots.map((s) => s.scene));
      for (const [i, s] of c.shots.entries()) {
        const r = rows.find((x) => x.title === c.title && x.label === s.label);
        const p = (r?.summary as { puckExitSpeed: { valueMps: number; uncertaintyMps: number } } | undefined)?.puckExitSpeed;
        expect(p, `${c.title} ${s.label}`).toBeTruthy();
        expect(Math.abs(p!.valueMps - truths[i].exitSpeedMps), `${c.title} ${s.label}`).toBeLessThanOrEqual(3 * p!.uncertaintyMps);
        checked++;
      }
    }
    expect(checked).toBeGreaterThanOrEqual(100);
  });

  it("has bench histories for at least six sticks, one softening through the season below the alert level", async () => {
    const tests = await db().select({ stickId: benchTest.stickId, date: benchTest.testedOn, flex: benchTest.measuredFlex, label: stick.label, rated: stick.ratedFlex }).from(benchTest).innerJoin(stick, eq(stick.id, benchTest.stickId)).where(inArray(stick.teamId, teams)).orderBy(benchTest.testedOn);
    const by = new Map<string, typeof tests>();
    for (const t of tests) by.set(t.stickId, [...(by.get(t.stickId) ?? []), t]);
    expect([...by.values()].filter((h) => h.length >= 2).length).toBeGreaterThanOrEqual(6);
    const softening = [...by.values()].filter((h) => h.length >= 5 && h.every((t, i) => i === 0 || t.flex! < h[i - 1].flex!));
    expect(softening.length).toBe(1);
    const h = softening[0];
    expect(Date.parse(h.at(-1)!.date) - Date.parse(h[0].date)).toBeGreaterThanOrEqual(60 * 86_400_000);
    expect(h.at(-1)!.flex! / h[0].rated!).toBeLessThan(0.85);
  });

  it("has clips in every state, shots published and in review, and shares with teammates", async () => {
    const clips = await db().select({ status: clip.status, confirmed: clip.captureFpsConfirmed, reason: clip.failureReason }).from(clip).where(inArray(clip.teamId, teams));
    expect(count(clips.filter((c) => c.status === "failed" && c.reason))).toBeGreaterThanOrEqual(1);
    expect(count(clips.filter((c) => c.status === "extracting"))).toBeGreaterThanOrEqual(1);
    expect(count(clips.filter((c) => c.status === "ready" && !c.confirmed))).toBeGreaterThanOrEqual(2);
    const shots = await db().select({ published: shot.publishedAt, results: shotResult.results, marks: shot.marks }).from(shot).leftJoin(shotResult, eq(shotResult.shotId, shot.id)).where(inArray(shot.teamId, teams));
    expect(count(shots.filter((s) => s.published))).toBeGreaterThanOrEqual(100);
    expect(count(shots.filter((s) => !s.published && s.results))).toBeGreaterThanOrEqual(4);
    expect(count(shots.filter((s) => !s.published && !s.results && Object.keys(s.marks as object).length === 0))).toBeGreaterThanOrEqual(4);
    const shares = await db().select({ to: shotShare.userId, team: shotShare.teamId, player: shot.playerId, published: shot.publishedAt }).from(shotShare).innerJoin(shot, eq(shot.id, shotShare.shotId)).where(inArray(shotShare.teamId, teams));
    expect(shares.length).toBeGreaterThanOrEqual(4);
    expect(new Set(shares.map((s) => s.team)).size).toBe(2);
    for (const s of shares) {
      expect(s.to).not.toBe(s.player);
      expect(s.published).not.toBeNull();
      const [m] = await db().select({ role: member.role }).from(member).where(and(eq(member.organizationId, s.team), eq(member.userId, s.to)));
      expect(m?.role).toBe("player");
    }
    expect(await db().select({ id: shot.id }).from(shot).where(and(inArray(shot.teamId, teams), isNull(shot.playerId)))).toEqual([]);
  });

  it("gives every role something on its pages in both teams", async () => {
    const as = async (email: string) => new Client(srv.url).signIn(email);
    const [coach, analyst, admin, player] = await Promise.all(["coach@ravens.example", "analyst@ravens.example", "admin@ravens.example", "player@ravens.example"].map(as));
    for (const team of teams) {
      const h = (await coach.get(`/api/teams/${team}/home`)).json as HomeResponse;
      expect(h.tasks.map((t) => t.key)).toEqual(expect.arrayContaining(["rateUnconfirmed", "clipsNotDigitised", "shotsToReview"]));
      expect(((await analyst.get(`/api/teams/${team}/home`)).json as HomeResponse).tasks.length).toBeGreaterThanOrEqual(3);
      expect(((await admin.get(`/api/teams/${team}/home`)).json as HomeResponse).tasks.map((t) => t.key)).toContain("staffSeats");
      const mine = ((await player.get(`/api/teams/${team}/home`)).json as HomeResponse).player!;
      expect(mine.latest.length, team).toBeGreaterThan(0);
      expect(mine.bests.length, team).toBeGreaterThanOrEqual(2);
      const progress = (await player.get(`/api/teams/${team}/readout/progress?shotType=all`)).json as ProgressResponse;
      expect(new Set(progress.points.map((p) => p.date)).size, team).toBeGreaterThanOrEqual(2);
      const sticks = (await coach.get(`/api/teams/${team}/sticks`)).json as { sticks: unknown[] };
      expect(sticks.sticks.length).toBeGreaterThanOrEqual(3);
      const shots = await coach.get(`/api/teams/${team}/readout/shots`);
      expect(shots.status, shots.text).toBe(200);
      expect(shots.json.total).toBeGreaterThanOrEqual(40);
    }
    // Theo's senior Progress opens on his most common shot type, over the season.
    const theo = (await player.get(`/api/teams/${ids.teamId}/readout/progress`)).json as ProgressResponse;
    expect(new Set(theo.points.map((p) => p.date)).size).toBeGreaterThanOrEqual(4);
    const senior = (await coach.get(`/api/teams/${ids.teamId}/home`)).json as HomeResponse;
    expect(senior.tasks.map((t) => t.key)).toEqual(expect.arrayContaining(["clipsFailed", "sticksBelowAlert"]));
  });

  it("is left alone by a second seed: nothing added", async () => {
    const tables = [shot, clip, benchTest, shotShare, trainingSession, member] as const;
    const counts = () => Promise.all(tables.map((t) => db().select({ n: sql<number>`count(*)::int` }).from(t)));
    const before = await counts();
    const t0 = Date.now();
    await seedDemo({ season: true });
    console.log(`second seed: ${((Date.now() - t0) / 1000).toFixed(1)} s (load average ${(await import("node:os")).loadavg().map((l) => l.toFixed(2)).join(" ")})`);
    expect(await counts()).toEqual(before);
  });
});
