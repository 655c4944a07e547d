// One stick, one stiffness per day (docs/decisions/122-stiffness-in-force.md): the bench test in
// force on the shot's date, the rating only when no test was made by then. One table of days runs
// against the SQL form and the pure rule; then every page that uses a stiffness — the readout
// (stored energy), the Digitise page and the beam built from a shot — must name the same one.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { db } from "../../server/db/client";
import { benchTest, clip, shot, shotResult, stick, trainingSession } from "../../server/db/schema";
import { benchTestInForce, stiffnessInForce } from "../../server/entities/stick/stiffness";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client, analyst: Client;
let stickId: string;
const T = () => `/api/teams/${world.teamId}`;
/** Readings exactly on a line of `flex` lbf/in (loads 20–80 lbf). */
const onLine = (flex: number) => [20, 40, 60, 80].map((load) => ({ load, deflection: load / flex }));

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  [coach, analyst] = await Promise.all([EMAILS.coach, EMAILS.analyst].map((e) => new Client(srv.url).signIn(e)));
  const s = await coach.post(`${T()}/sticks`, { label: "Dated stick", ratedFlex: 85 });
  stickId = s.json.id;
  // Two tests on one day: the one entered last is in force.
  for (const [date, flex] of [["2026-01-10", 80], ["2026-06-01", 70], ["2026-08-01", 65], ["2026-08-01", 60]] as const) {
    const r = await analyst.post(`${T()}/sticks/${stickId}/bench-tests`, { date, loadUnit: "lbf", deflectionUnit: "in", readings: onLine(flex) });
    expect(r.status, r.text).toBe(201);
  }
});
afterAll(() => srv.close());

const days: [string, "rated" | number][] = [
  ["2025-12-31", "rated"], ["2026-01-09", "rated"], ["2026-01-10", 80], ["2026-03-01", 80], ["2026-05-31", 80],
  ["2026-06-01", 70], ["2026-07-31", 70], ["2026-08-01", 60], ["2027-01-01", 60],
];

describe("the stiffness in force: one table, both forms", () => {
  it.each(days)("on %s", async (day, expected) => {
    const tests = await db().select().from(benchTest).where(eq(benchTest.stickId, stickId)).orderBy(benchTest.testedOn, benchTest.createdAt);
    const pure = stiffnessInForce({ ratedFlex: 85, tests }, day);
    const [row] = await db().select({ t: benchTestInForce(stick.id, sql`${day}`) }).from(stick).where(eq(stick.id, stickId));
    const flexOf = (k: { source: string; flex: number } | null) => (k?.source === "rated" ? "rated" : Math.round(k!.flex));
    expect(flexOf(pure)).toBe(expected);
    expect(row.t ? Math.round(row.t.measuredFlex) : "rated").toBe(expected);
    if (row.t) expect(row.t.testedOn).toBe(pure!.testedOn);
  });
});

async function shotOn(date: string) {
  const [session] = await db().insert(trainingSession).values({ teamId: world.teamId, date, venue: "Lakeport Arena" }).returning();
  const [c] = await db().insert(clip).values({ teamId: world.teamId, captureFps: 3200, status: "ready", sessionId: session.id, stickId }).returning();
  const [s] = await db().insert(shot).values({ teamId: world.teamId, clipId: c.id, stickId, label: `On ${date}` }).returning();
  await db().insert(shotResult).values({
    shotId: s.id, teamId: world.teamId, engineVersion: "test", shotVersion: 1,
    results: { shaftDeflection: { valueMm: 38, uncertaintyMm: 1, interval95Mm: null, frame: 42, aMm: 450, bMm: 750 } },
  });
  return s.id;
}

async function stiffnessShown(shotId: string) {
  const readout = await coach.get(`${T()}/readout/shots/${shotId}`);
  const digitise = await coach.get(`${T()}/shots/${shotId}`);
  const beam = await coach.get(`${T()}/beam/shots/${shotId}`);
  expect(beam.status, beam.text).toBe(200);
  return {
    readout: [readout.json.stick.flexSource, Math.round(readout.json.stick.flex), readout.json.stick.testedOn],
    digitise: [digitise.json.stick.flexSource, Math.round(digitise.json.stick.flex), digitise.json.stick.testedOn],
    beam: [beam.json.stiffness.source === "bench" ? "measured" : "rated", beam.json.stiffness.testedOn],
  };
}

describe("every page names the same stiffness for a shot", () => {
  it("a shot between two tests: the earlier test, not the latest", async () => {
    expect(await stiffnessShown(await shotOn("2026-03-01"))).toEqual({
      readout: ["measured", 80, "2026-01-10"], digitise: ["measured", 80, "2026-01-10"], beam: ["measured", "2026-01-10"],
    });
  });
  it("a shot before any test: the rated flex, not a test made later", async () => {
    expect(await stiffnessShown(await shotOn("2025-12-01"))).toEqual({
      readout: ["rated", 85, null], digitise: ["rated", 85, null], beam: ["rated", null],
    });
  });
});
