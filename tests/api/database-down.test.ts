// PostgreSQL going away mid-request is not "not found": each lookup a route family starts with
// must let the outage through (the error handler answers 503 database_unavailable) instead of
// turning it into a 404 that tells a coach their clip is gone. The app's database connection
// runs through a loopback proxy this test cuts, after sign-in and role checks have passed.
import net from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedWorld } from "./helpers";
import { HttpError } from "../../server/http/problem";
import { isDatabaseDown } from "../../server/http/database-down";
import type { Actor } from "../../server/entities/member/role";

const sockets = new Set<net.Socket>();
const target = new URL(process.env.DATABASE_URL!);
const proxy = net.createServer((client) => {
  const upstream = net.connect(Number(target.port), target.hostname);
  for (const s of [client, upstream]) {
    sockets.add(s);
    s.on("error", () => s.destroy());
    s.on("close", () => sockets.delete(s));
  }
  client.pipe(upstream).pipe(client);
});
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Actor;
const ids = { clip: "", shot: "", stick: "" };

beforeAll(async () => {
  await new Promise<void>((r) => proxy.listen(0, "127.0.0.1", () => r()));
  const via = new URL(process.env.DATABASE_URL!);
  via.port = String((proxy.address() as net.AddressInfo).port);
  process.env.DATABASE_URL = via.toString(); // before the first query: db() reads it lazily
  world = await seedWorld();
  coach = { userId: world.users["coach@ravens.example"]!, teamId: world.teamId, role: "coach" };
  const { db } = await import("../../server/db/client");
  const { clip, shot, stick } = await import("../../server/db/schema");
  const [s] = await db().insert(stick).values({ teamId: world.teamId, label: "Down stick", ratedFlex: 85 }).returning();
  const [c] = await db().insert(clip).values({ teamId: world.teamId, captureFps: 240, status: "ready", stickId: s.id }).returning();
  const [sh] = await db().insert(shot).values({ teamId: world.teamId, clipId: c.id, stickId: s.id }).returning();
  Object.assign(ids, { clip: c.id, shot: sh.id, stick: s.id });
  // The database goes away: open connections are cut, new ones refused.
  const closed = new Promise<void>((r) => proxy.close(() => r()));
  for (const s of sockets) s.destroy();
  await closed;
});
afterAll(() => proxy.close());

const lookups: [string, () => Promise<unknown>][] = [
  ["a clip", async () => (await import("../../server/clips/service")).visibleClip(coach, ids.clip)],
  ["a clip's shots", async () => (await import("../../server/shots/service")).listShots(coach, ids.clip)],
  ["a shot on the Digitise page", async () => (await import("../../server/shots/service")).getShot(coach, ids.shot)],
  ["a shot's readout", async () => (await import("../../server/readout/service")).getReadout(coach, ids.shot)],
  ["a stick", async () => (await import("../../server/sticks/service")).stickDetail(coach, ids.stick)],
  ["the beam from a shot", async () => (await import("../../server/sticks/beam-service")).beamFromShotRequest(coach, ids.shot)],
];

describe("with the database away, lookups do not answer 'not found'", { timeout: 60_000 }, () => {
  it.each(lookups)("%s", async (_what, lookup) => {
    const err = await lookup().then(() => null, (e: unknown) => e);
    expect(err, "the lookup should have failed").not.toBeNull();
    expect(err instanceof HttpError ? `${err.status} ${err.code}` : "not an HttpError").toBe("not an HttpError");
    expect(isDatabaseDown(err)).toBe(true);
  });
});
