import type { Ctx, RouteCase } from "../route-table";
import { computeShot, syntheticShot, type SyntheticShotOptions } from "../../../shared/mechanics/index";
import type { Mark } from "../../../shared/schemas/shot-document";
import type { ShotResults } from "../../../shared/schemas/shot-results";

const ALL = ["admin", "coach", "analyst", "player"] as const;
const SHARERS = ["admin", "coach"] as const;
const STAFF = ["admin", "coach", "analyst"] as const;
const PLAYER_EMAIL = "player@ravens.example";

// The engine's made-up slap shot ([CP] a synthetic scene with known answers), moved onto the
// clip's frame numbers (the first frame is 1) and a 2000 × 720 frame.
const DX = 900;
export function scene(o: SyntheticShotOptions = {}) {
  const { doc, truth } = syntheticShot({ frames: 400, noisePx: 0.2, seed: "readout", ...o });
  const shift = (t: Mark[] | undefined) => (t ?? []).map(([f, x, y]) => [f + 1, x + DX, y] as Mark);
  const marks = Object.fromEntries(Object.entries(doc.tracks).map(([k, t]) => [k, shift(t as Mark[])]));
  const e = doc.events;
  const events = { iceStrike: e.iceStrike! + 1, puckStrike: e.puckStrike + 1, peakBend: e.peakBend! + 1, release: e.release + 1 };
  const cal = doc.calibration as { type: "scaleBar"; a: [number, number]; b: [number, number]; lengthMm: number };
  const calibration = { type: "scaleBar" as const, a: [cal.a[0] + DX, cal.a[1]] as [number, number], b: [cal.b[0] + DX, cal.b[1]] as [number, number], lengthMm: cal.lengthMm, lengthUnit: "mm" as const };
  return { marks, events, calibration, truth, captureFps: doc.captureFps, frames: 400 };
}

export interface FixtureShot {
  teamId: string;
  playerId?: string | null;
  stickId?: string | null;
  label?: string;
  shotType?: "slap" | "wrist" | "snap" | "backhand";
  /** A training session on this date holds the clip. */
  sessionDate?: string;
  /** No calibration: the shot has marks but no results. */
  uncalibrated?: boolean;
  scene?: SyntheticShotOptions;
  /** Published to its player (the default here); false leaves it in staff review. */
  published?: boolean;
}

const computed = new Map<string, ShotResults>();

/**
 * A clip, a shot with the scene's marks and events, and the engine's results stored the way the
 * shots area stores them (computeShot on the same document). Rows only: fast enough for the policy table.
 */
export async function insertShotWithResults(f: FixtureShot) {
  const { db } = await import("../../../server/db/client");
  const { clip, shot, shotResult, trainingSession } = await import("../../../server/db/schema");
  const { ENGINE_VERSION } = await import("../../../shared/mechanics/index");
  const s = scene(f.scene);
  let sessionId: string | null = null;
  if (f.sessionDate) {
    const [row] = await db().insert(trainingSession).values({ teamId: f.teamId, date: f.sessionDate, venue: "Lakeport rink 2" }).returning({ id: trainingSession.id });
    sessionId = row.id;
  }
  const [c] = await db()
    .insert(clip)
    .values({
      teamId: f.teamId, sessionId, title: `${f.label ?? "Fixture"} clip`, status: "ready", captureFps: s.captureFps, captureFpsConfirmed: true, frameCount: s.frames,
      framesDone: s.frames, width: 2000, height: 720, playerId: f.playerId ?? null, stickId: f.stickId ?? null, originalName: "fixture.mp4",
      shotType: f.shotType ?? "slap", calibration: f.uncalibrated ? null : s.calibration,
    })
    .returning({ id: clip.id });
  const [sh] = await db()
    .insert(shot)
    .values({
      teamId: f.teamId, clipId: c.id, playerId: f.playerId ?? null, stickId: f.stickId ?? null, label: f.label ?? "", frameStart: 1, frameEnd: s.frames, marks: s.marks, events: s.events,
      publishedAt: f.published === false ? null : new Date(),
    })
    .returning({ id: shot.id });
  let results: ShotResults | null = null;
  if (!f.uncalibrated) {
    const key = JSON.stringify(f.scene ?? {});
    results = computed.get(key) ?? computeShot({ captureFps: s.captureFps, calibration: { type: "scaleBar", a: s.calibration.a, b: s.calibration.b, lengthMm: s.calibration.lengthMm }, tracks: s.marks, events: s.events, frameRange: [1, s.frames], stick: null }, { trials: 60 });
    computed.set(key, results);
  }
  await db().insert(shotResult).values({
    shotId: sh.id, teamId: f.teamId, engineVersion: ENGINE_VERSION, results, shotVersion: 1,
    error: results ? null : "To compute results this shot still needs a calibration for the clip (scale bar or plane).",
  });
  return { clipId: c.id, shotId: sh.id, results, scene: s };
}

async function playerShot(c: Ctx) {
  const { shotId } = await insertShotWithResults({ teamId: c.teamId, playerId: c.users[PLAYER_EMAIL], label: "Policy shot" });
  return { shotId };
}

async function inReviewPlayerShot(c: Ctx) {
  const { shotId } = await insertShotWithResults({ teamId: c.teamId, playerId: c.users[PLAYER_EMAIL], label: "Policy shot in review", published: false });
  return { shotId };
}

async function sharedPlayerShot(c: Ctx) {
  const { shotId } = await playerShot(c);
  const r = await c.admin.post(`${T(c)}/shots/${shotId}/shares`, { player: true });
  if (r.status !== 201) throw new Error(`share fixture: ${r.status} ${r.text}`);
  return { shotId };
}

async function twoPlayerShots(c: Ctx) {
  const a = await insertShotWithResults({ teamId: c.teamId, playerId: c.users[PLAYER_EMAIL], label: "Policy A" });
  const b = await insertShotWithResults({ teamId: c.teamId, playerId: c.users[PLAYER_EMAIL], label: "Policy B", scene: { captureFps: 1000 } });
  return { a: a.shotId, b: b.shotId };
}

const T = (c: Ctx) => `/api/teams/${c.teamId}/readout`;

/** Rows of the policy table for this area (see tests/api/route-table.ts). */
export const readoutRoutes: RouteCase[] = [
  { name: "list shots (readout)", method: "GET", path: (c) => `${T(c)}/shots`, allowed: ALL, teamScoped: true, fixture: playerShot },
  { name: "shot readout", method: "GET", path: (c) => `${T(c)}/shots/${c.ids.shotId}`, allowed: ALL, teamScoped: true, fixture: playerShot },
  // In review: staff only, even for the shot's own player.
  { name: "shot readout, in review", method: "GET", path: (c) => `${T(c)}/shots/${c.ids.shotId}`, allowed: STAFF, teamScoped: true, fixture: inReviewPlayerShot },
  { name: "publish a shot", method: "PUT", path: (c) => `${T(c)}/shots/${c.ids.shotId}/publication`, body: () => ({ notify: false }), allowed: SHARERS, teamScoped: true, fixture: inReviewPlayerShot },
  { name: "take a shot back to review", method: "DELETE", path: (c) => `${T(c)}/shots/${c.ids.shotId}/publication`, allowed: SHARERS, teamScoped: true, fixture: playerShot },
  { name: "compare two shots", method: "GET", path: (c) => `${T(c)}/compare?a=${c.ids.a}&b=${c.ids.b}`, allowed: ALL, teamScoped: true, fixture: twoPlayerShots },
  { name: "review settings", method: "GET", path: (c) => `${T(c)}/settings`, allowed: ALL, teamScoped: true },
  { name: "change review settings", method: "PATCH", path: (c) => `${T(c)}/settings`, body: () => ({ autoPublish: false }), allowed: ["admin"], teamScoped: true },
  { name: "players for progress", method: "GET", path: (c) => `${T(c)}/players`, allowed: ALL, teamScoped: true },
  { name: "player progress", method: "GET", path: (c) => `${T(c)}/progress?playerId=${c.users[PLAYER_EMAIL]}`, allowed: ALL, teamScoped: true, fixture: playerShot },
  {
    name: "share a shot", method: "POST", path: (c) => `${T(c)}/shots/${c.ids.shotId}/shares`, body: () => ({ player: true }),
    allowed: SHARERS, teamScoped: true, fixture: playerShot,
  },
  {
    name: "stop sharing a shot", method: "DELETE", path: (c) => `${T(c)}/shots/${c.ids.shotId}/shares/${c.users[PLAYER_EMAIL]}`,
    allowed: SHARERS, teamScoped: true, fixture: sharedPlayerShot,
  },
  { name: "marks CSV", method: "GET", path: (c) => `${T(c)}/shots/${c.ids.shotId}/marks.csv`, allowed: ALL, teamScoped: true, fixture: playerShot },
  { name: "results CSV", method: "GET", path: (c) => `${T(c)}/shots/${c.ids.shotId}/results.csv`, allowed: ALL, teamScoped: true, fixture: playerShot },
  { name: "PDF report", method: "GET", path: (c) => `${T(c)}/shots/${c.ids.shotId}/report.pdf`, allowed: ALL, teamScoped: true, fixture: playerShot },
];
