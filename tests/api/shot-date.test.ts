// A shot's date is one rule (server/entities/shot/date.ts): its clip's session date, else the
// day its clip was uploaded. Every page that shows a shot's date must say the same day. Before the
// rule lived in one place the stick page used the day the shot was digitised instead.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { db } from "../../server/db/client";
import { clip, shot, stick, trainingSession } from "../../server/db/schema";

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
