// The two hot reads (the clips table, one shot's readout) check membership inside their own
// statement and answer before the team's routers (decision 195). Held here: the clips table's rows,
// built by PostgreSQL, equal toSummary's key for key in every state a clip can be in; and the checks
// requireTeamMember makes on every other team route hold for them on the very next request after a
// role changes or a member is removed (each process guesses the role it saw last: never trusted).
import { describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { Client, EMAILS, useWorld } from "./helpers";
import { db } from "../../server/db/client";
import { clip, member, stick, trainingSession } from "../../server/db/schema";
import { clipInTeam } from "../../server/entities/clip/repository";
import { toSummary } from "../../server/clips/present";
import { createAccount } from "../../server/auth/accounts";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";

const w = useWorld(EMAILS.admin);
const team = () => `/api/teams/${w.world.teamId}`;

/** A new person in the team with this role, signed in. */
async function newMember(role: string, name: string) {
  const email = `${name.toLowerCase().replace(/\W+/g, ".")}@ravens.example`;
  const { userId } = await createAccount({ email, password: DEMO_PASSWORD, name, emailVerified: true, signIn: false });
  await db().insert(member).values({ id: crypto.randomUUID(), organizationId: w.world.teamId, userId, role, createdAt: new Date() });
  return { userId, client: await new Client(w.srv.url).signIn(email) };
}
const setRole = (userId: string, role: string) => db().update(member).set({ role }).where(and(eq(member.userId, userId), eq(member.organizationId, w.world.teamId)));

async function insertClip(v: Partial<typeof clip.$inferInsert>) {
  const [row] = await db().insert(clip).values({ teamId: w.world.teamId, captureFps: 240, originalName: "hot.mp4", ...v }).returning({ id: clip.id });
  return row.id;
}
async function shotOn(clipId: string) {
  const r = await w.signedIn.post(`${team()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 30 });
  expect(r.status, r.text).toBe(201);
  return r.json.id as string;
}
const clipIds = async (c: Client, q = "pageSize=100") => {
  const r = await c.get(`${team()}/clips?${q}`);
  expect(r.status, r.text).toBe(200);
  return (r.json.items as { id: string }[]).map((x) => x.id);
};

describe("the clips table built by PostgreSQL (decision 195)", () => {
  it("equals toSummary's rows key for key, clips in every state included", async () => {
    const player = w.world.users[EMAILS.player];
    const [session] = await db().insert(trainingSession).values({ teamId: w.world.teamId, date: "2026-03-14", venue: "Lakeport Arena", drill: "Slap shots" }).returning();
    const [s] = await db().insert(stick).values({ teamId: w.world.teamId, label: "Team stick 85", ownerId: player }).returning();
    const timing = { clock: "uneven" as const, nominalFps: 239.76, tickS: 1 / 90000, gaps: [{ after: 12, missing: 2 }], gapCount: 1, repeats: [40], repeatCount: 1, missingTail: null };
    const variants: Partial<typeof clip.$inferInsert>[] = [
      { title: "Just started", status: "uploading", framesDone: 0, frameCount: null },
      { title: "A third done", status: "extracting", framesDone: 1, frameCount: 3, width: 1920, height: 1080, codec: "h264", durationS: 2.002 },
      { title: "Almost", status: "extracting", framesDone: 7, frameCount: 30, playerId: player, sessionId: session.id, stickId: s.id, timing },
      { title: "Ready", status: "ready", framesDone: 480, frameCount: 480, captureFps: 3200, storedFps: 30, captureFpsConfirmed: true, rotationDeg: 90, variableFrameRate: true, sizeBytes: 9_876_543_210, uploadedBy: w.world.users[EMAILS.coach], playerId: player },
      { title: "Broken", status: "failed", failureReason: "The file ends in the middle of a frame.", framesDone: 0, frameCount: 0 },
      { title: "Ready, counted oddly", status: "ready", framesDone: 0, frameCount: null, captureFps: 119.88, storedFps: 29.97 },
      // PostgreSQL keeps microseconds; JavaScript dates (and the API) keep milliseconds.
      { title: "Odd instant", status: "probing", createdAt: new Date("2026-01-02T03:04:05.999Z"), uploadedBy: w.world.users[EMAILS.analyst] },
    ];
    const ids: string[] = [];
    for (const v of variants) ids.push(await insertClip(v));
    await db().execute(`update clip set created_at = '2026-01-02 03:04:05.999987+00' where id = '${ids.at(-1)}'` as never);

    const page = (await w.signedIn.get(`${team()}/clips?pageSize=100`)).json;
    for (const id of ids) {
      const got = page.items.find((x: { id: string }) => x.id === id);
      const want = JSON.parse(JSON.stringify(toSummary((await clipInTeam(w.world.teamId, id))!)));
      expect(got, want.title).toEqual(want);
      expect(Object.keys(got), want.title).toEqual(Object.keys(want));
    }
    expect(page.total).toBe(page.items.length);
    // The Clips page's own size (written into its statement) pages the same rows in the same order.
    const byDefault = [...(await w.signedIn.get(`${team()}/clips`)).json.items, ...(await w.signedIn.get(`${team()}/clips?page=2`)).json.items];
    expect(byDefault.map((x: { id: string }) => x.id)).toEqual(page.items.slice(0, 40).map((x: { id: string }) => x.id));
    expect(page.items.find((x: { id: string }) => x.id === ids.at(-1)).createdAt).toBe("2026-01-02T03:04:05.999Z");
  });
});

describe("the hot reads check membership in their own statement (decision 195)", () => {
  it("a coach made a player sees only their own clips and shots on the very next read, and the team again when made coach", async () => {
    const { userId, client } = await newMember("coach", "Dana Hotread");
    const own = await insertClip({ title: "Dana's own", status: "ready", framesDone: 30, frameCount: 30, width: 1280, height: 720, playerId: userId });
    const other = await insertClip({ title: "Someone else's", status: "ready", framesDone: 30, frameCount: 30, width: 1280, height: 720, playerId: w.world.users[EMAILS.player] });
    const otherShot = await shotOn(other);
    expect(await clipIds(client)).toEqual(expect.arrayContaining([own, other]));
    expect((await client.get(`${team()}/readout/shots/${otherShot}`)).status).toBe(200);

    await setRole(userId, "player");
    expect(await clipIds(client)).toEqual([own]);
    expect((await client.get(`${team()}/clips?playerId=${w.world.users[EMAILS.player]}`)).json).toMatchObject({ items: [], total: 0 });
    const refused = await client.get(`${team()}/readout/shots/${otherShot}`);
    expect(refused.status).toBe(404);
    expect(refused.text).not.toContain("Someone else");

    await setRole(userId, "coach");
    expect(await clipIds(client)).toEqual(expect.arrayContaining([own, other]));
    expect((await client.get(`${team()}/readout/shots/${otherShot}`)).status).toBe(200);
  });

  it("a member removed from the team is refused on the very next read, with nothing of the team in the answer", async () => {
    const { userId, client } = await newMember("analyst", "Robin Hotread");
    const clipId = await insertClip({ title: "Analysed yesterday", status: "ready", framesDone: 30, frameCount: 30, width: 1280, height: 720 });
    const shotId = await shotOn(clipId);
    expect(await clipIds(client)).toContain(clipId);
    expect((await client.get(`${team()}/readout/shots/${shotId}`)).status).toBe(200);

    await db().delete(member).where(and(eq(member.userId, userId), eq(member.organizationId, w.world.teamId)));
    for (const path of [`${team()}/clips?pageSize=100`, `${team()}/readout/shots/${shotId}`]) {
      const r = await client.get(path);
      expect(r.status, path).toBe(404);
      expect(r.headers.get("content-type")).toMatch(/application\/problem\+json/);
      expect(r.json.detail).toMatch(/team/i);
      expect(r.text).not.toContain("Analysed yesterday");
    }
  });

  it("a bad query is refused only for members: anyone else learns nothing of the team", async () => {
    const outsider = await new Client(w.srv.url).signIn(w.world.outsiderEmail);
    expect((await outsider.get(`${team()}/clips?sort=nonsense`)).status).toBe(404);
    expect((await outsider.get(`${team()}/readout/shots/not-a-shot`)).status).toBe(404);
    const bad = await w.signedIn.get(`${team()}/clips?sort=nonsense`);
    expect(bad.status).toBe(422);
    expect(bad.json.code).toBe("validation_failed");
    expect((await new Client(w.srv.url).get(`${team()}/clips`)).status).toBe(401);
  });
});

describe("the hot reads are routes of the app itself (decision 198)", () => {
  it("answer the same paths as when they sat in a router mounted at /api: any letter case, a trailing slash; nothing else", async () => {
    const clipId = await insertClip({ title: "Any case", status: "ready", framesDone: 30, frameCount: 30, width: 1280, height: 720 });
    const shotId = await shotOn(clipId);
    const t = w.world.teamId;
    for (const path of [`/API/Teams/${t}/Clips?pageSize=100`, `/api/teams/${t}/clips/?pageSize=100`]) {
      const r = await w.signedIn.get(path);
      expect(r.status, path).toBe(200);
      expect((r.json.items as { id: string }[]).map((x) => x.id), path).toContain(clipId);
    }
    for (const path of [`/Api/teams/${t}/Readout/Shots/${shotId}`, `/api/teams/${t}/readout/shots/${shotId}/`]) {
      const r = await w.signedIn.get(path);
      expect(r.status, path).toBe(200);
      expect(r.json.shot.id, path).toBe(shotId);
    }
    const list = await w.signedIn.get(`/API/teams/${t}/readout/shots/?pageSize=50`);
    expect(list.status).toBe(200);
    expect((list.json.shots as { id: string }[]).map((x) => x.id)).toContain(shotId);
    // Near misses are no hot read: a doubled slash, a path below the route.
    expect((await w.signedIn.get(`/api//teams/${t}/clips`)).status).toBe(404);
    expect((await w.signedIn.get(`/api/teams/${t}/clips/${clipId}/nothing-here`)).status).toBe(404);
  });
});
