import type { Ctx, RouteCase } from "../route-table";

const ALL = ["admin", "coach", "analyst", "player"] as const;
const STAFF = ["admin", "coach", "analyst"] as const;
const PLAYER_EMAIL = "player@ravens.example";

/** A ready clip row (no frame files: the shots API only reads its size, frame count and rate). */
export async function insertReadyClip(teamId: string, v: { playerId?: string | null; frameCount?: number; width?: number; height?: number; captureFps?: number; stickId?: string | null } = {}) {
  const { db } = await import("../../../server/db/client");
  const { clip } = await import("../../../server/db/schema");
  const [row] = await db()
    .insert(clip)
    .values({
      teamId, title: "Fixture clip", status: "ready", captureFps: v.captureFps ?? 3200, frameCount: v.frameCount ?? 400, framesDone: v.frameCount ?? 400,
      width: v.width ?? 1280, height: v.height ?? 720, playerId: v.playerId ?? null, stickId: v.stickId ?? null, originalName: "fixture.mp4",
    })
    .returning({ id: clip.id });
  return row.id;
}

async function clipFixture(c: Ctx) {
  return { clipId: await insertReadyClip(c.teamId, { playerId: c.users[PLAYER_EMAIL] }) };
}

export async function shotFixture(c: Ctx) {
  const { clipId } = await clipFixture(c);
  const r = await c.admin.post(`/api/teams/${c.teamId}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 300 });
  if (r.status !== 201) throw new Error(`shot fixture: ${r.status} ${r.text}`);
  // Published, so its player may read it (a shot in review is staff-only: tests/api/shot-publishing.test.ts).
  const p = await c.admin.put(`/api/teams/${c.teamId}/readout/shots/${r.json.id}/publication`, { notify: false });
  if (p.status !== 200) throw new Error(`publish fixture: ${p.status} ${p.text}`);
  return { clipId, shotId: r.json.id as string };
}

/** Rows of the policy table for this area (see tests/api/route-table.ts). */
export const shotsRoutes: RouteCase[] = [
  { name: "list shots of a clip", method: "GET", path: (c) => `/api/teams/${c.teamId}/clips/${c.ids.clipId}/shots`, allowed: ALL, teamScoped: true, fixture: shotFixture },
  {
    name: "create shot", method: "POST", path: (c) => `/api/teams/${c.teamId}/clips/${c.ids.clipId}/shots`, body: () => ({ frameStart: 10, frameEnd: 200 }),
    allowed: STAFF, teamScoped: true, fixture: clipFixture,
  },
  {
    name: "set clip calibration", method: "PUT", path: (c) => `/api/teams/${c.teamId}/clips/${c.ids.clipId}/calibration`,
    body: () => ({ calibration: { type: "scaleBar", a: [100, 600], b: [140, 600], lengthMm: 76.2 } }), allowed: STAFF, teamScoped: true, fixture: shotFixture,
  },
  { name: "get shot", method: "GET", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}`, allowed: ALL, teamScoped: true, fixture: shotFixture },
  {
    name: "update shot", method: "PATCH", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}`, body: () => ({ label: "Renamed" }),
    allowed: STAFF, teamScoped: true, fixture: shotFixture,
  },
  {
    name: "save marks and events", method: "PUT", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}/marks`,
    body: () => ({ baseVersion: 1, marks: { puck: [[20, 400.25, 300.5]] }, events: { iceStrike: 15 } }), allowed: STAFF, teamScoped: true, fixture: shotFixture,
  },
  { name: "delete shot", method: "DELETE", path: (c) => `/api/teams/${c.teamId}/shots/${c.ids.shotId}`, allowed: STAFF, teamScoped: true, fixture: shotFixture },
];
