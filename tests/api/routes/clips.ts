import { afterAll } from "vitest";
import type { Ctx, RouteCase } from "../route-table";

// Rows of the policy table for clip ingest (see tests/api/route-table.ts). The tus endpoint
// (/api/uploads) needs tus headers this table does not send; its roles are checked in
// tests/api/clips-bad-input.test.ts ("uploads only for those who may").

const ALL = ["admin", "coach", "analyst", "player"] as const;
const STAFF = ["admin", "coach", "analyst"] as const;
const created: string[] = [];

/** A clip with two stored frames, a strip, a thumbnail and an original, of the team's first player. */
async function clipFixture(c: Ctx, status: "ready" | "failed" = "ready") {
  const { randomUUID } = await import("node:crypto");
  const { Readable } = await import("node:stream");
  const sharp = (await import("sharp")).default;
  const { insertClip } = await import("../../../server/entities/clip/repository");
  const { storage } = await import("../../../server/clips/deps");
  const { clipKeys } = await import("../../../server/storage");
  const { thumbnailKey } = await import("../../../server/jobs/clip-extract");
  const id = randomUUID();
  const jpeg = await sharp({ create: { width: 16, height: 9, channels: 3, background: "#336699" } }).jpeg().toBuffer();
  const st = storage();
  for (const key of [clipKeys.frame(id, 1, "jpg"), clipKeys.frame(id, 2, "jpg"), clipKeys.strip(id), thumbnailKey(id)]) await st.putStream(key, Readable.from([jpeg]));
  await st.putStream(clipKeys.original(id), Readable.from([Buffer.from("not really a video, but bytes to range over")]));
  created.push(id);
  await insertClip({
    id, teamId: c.teamId, playerId: c.users["player@ravens.example"], uploadedBy: c.users["coach@ravens.example"], title: "Policy fixture",
    captureFps: 240, storedFps: 30, status, failureReason: status === "failed" ? "test failure" : null, frameCount: 2, framesDone: 2,
    width: 16, height: 9, frameTimes: [0, 1 / 30], sha256: randomUUID().replace(/-/g, ""), sizeBytes: 44, originalName: "fixture.mp4",
  });
  return { clipId: id };
}

afterAll(async () => {
  if (!created.length) return;
  const { storage } = await import("../../../server/clips/deps");
  for (const id of created) await storage().deletePrefix(`clips/${id}/`);
});

const clip = (c: Ctx, rest = "") => `/api/teams/${c.teamId}/clips/${c.ids.clipId}${rest}`;

export const clipsRoutes: RouteCase[] = [
  { name: "clip form options", method: "GET", path: (c) => `/api/teams/${c.teamId}/clip-options`, allowed: STAFF, teamScoped: true },
  { name: "list clips", method: "GET", path: (c) => `/api/teams/${c.teamId}/clips?sort=title&dir=asc`, allowed: ALL, teamScoped: true },
  { name: "get clip", method: "GET", path: (c) => clip(c), allowed: ALL, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "edit clip", method: "PATCH", path: (c) => clip(c), body: () => ({ notes: "Lab camera A", captureFps: 3200 }), allowed: STAFF, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "what deleting a clip takes", method: "GET", path: (c) => clip(c, "/deletion"), allowed: STAFF, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "delete clip", method: "DELETE", path: (c) => clip(c), allowed: STAFF, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "retry clip", method: "POST", path: (c) => clip(c, "/retry"), allowed: STAFF, teamScoped: true, fixture: (c) => clipFixture(c, "failed") },
  { name: "clip progress", method: "GET", path: (c) => clip(c, "/progress"), allowed: ALL, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "clip frame", method: "GET", path: (c) => clip(c, "/frames/1"), allowed: ALL, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "clip strip", method: "GET", path: (c) => clip(c, "/strip"), allowed: ALL, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "clip thumbnail", method: "GET", path: (c) => clip(c, "/thumbnail"), allowed: ALL, teamScoped: true, fixture: (c) => clipFixture(c) },
  { name: "clip original", method: "GET", path: (c) => clip(c, "/original"), allowed: ALL, teamScoped: true, fixture: (c) => clipFixture(c) },
];
