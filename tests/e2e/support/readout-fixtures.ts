// Shots for the readout end-to-end tests, made in the e2e server's database and upload folder
// (DATABASE_URL, UPLOAD_DIR): made-up slap shots of the demo club ([CP] the engine's synthetic
// scene with known answers), with frames drawn from their own marks so the pictures match the
// numbers, and results computed by the server's own recomputeShot. Prints the ids as JSON.
//   node --import tsx tests/e2e/support/readout-fixtures.ts
import { Readable } from "node:stream";
import { and, eq } from "drizzle-orm";
import sharp from "sharp";
import { db } from "../../../server/db/client";
import { clip, member, organization, shot, stick, trainingSession, user } from "../../../server/db/schema";
import { storage } from "../../../server/clips/deps";
import { clipKeys } from "../../../server/storage";
import { recomputeShot } from "../../../server/shots/results";
import { DEMO_TEAM } from "../../../server/seed/demo-people";
import { syntheticShot, type SyntheticShotOptions } from "../../../shared/mechanics/index";
import type { Mark } from "../../../shared/schemas/shot-document";

const W = 1280;
const H = 720;

interface Spec {
  key: string;
  playerEmail: string;
  label: string;
  date: string;
  fps: number;
  frames: number;
  scene: SyntheticShotOptions;
  /**
   * How much quicker the whole motion is than the engine's standard made-up shot (25 ms load,
   * 30 ms contact): the scene is drawn for fps ÷ tempo and played at fps, so every time shrinks
   * and every speed grows by this factor, consistently.
   */
  tempo?: number;
  stick?: string;
  shotType?: "slap" | "wrist";
  drawFrames: boolean;
  /** No calibration on the clip: marks but no results yet. */
  uncalibrated?: boolean;
  /** Landmarks left unmarked (e.g. the hands: a shot with no bend marks). */
  unmarked?: string[];
}

const SPECS: Spec[] = [
  { key: "morning", playerEmail: "player@ravens.example", label: "Point shot, morning", date: "2026-11-02", fps: 3200, frames: 300, tempo: 1.2, stick: "Theo's gamer — 85 flex", drawFrames: true, scene: { exitSpeedMps: 26, bladeSpeedMps: 19, peakDeflectionMm: 38, seed: "e2e-a" } },
  { key: "evening", playerEmail: "player@ravens.example", label: "Point shot, evening", date: "2026-11-09", fps: 1000, frames: 120, stick: "Theo's gamer — 85 flex", drawFrames: true, scene: { exitSpeedMps: 27.5, bladeSpeedMps: 21, peakDeflectionMm: 52, seed: "e2e-b" } },
  { key: "early", playerEmail: "player@ravens.example", label: "First test", date: "2026-10-19", fps: 1000, frames: 120, drawFrames: false, scene: { exitSpeedMps: 24, bladeSpeedMps: 19, peakDeflectionMm: 30, seed: "e2e-c" } },
  { key: "pending", playerEmail: "player@ravens.example", label: "Not calibrated yet", date: "2026-11-16", fps: 1000, frames: 120, drawFrames: false, uncalibrated: true, scene: { seed: "e2e-e" } },
  { key: "nobend", playerEmail: "player2@ravens.example", label: "Wrist shot, puck and blade only", date: "2026-11-10", fps: 1000, frames: 120, shotType: "wrist", drawFrames: false, unmarked: ["topHand", "bottomHand"], scene: { exitSpeedMps: 21, seed: "e2e-f" } },
  { key: "jonah", playerEmail: "player2@ravens.example", label: "Jonah's wrist shot", date: "2026-11-09", fps: 1000, frames: 120, shotType: "wrist", drawFrames: false, scene: { exitSpeedMps: 22, seed: "e2e-d" } },
];

/** The scene in pixels of a W × H frame: scaled and shifted so every mark is on the picture. */
function sceneOf(s: Spec) {
  // A slower camera sees more travel in the shot's frames: a coarser scale keeps it on the picture.
  const mmPerPx = s.fps >= 3000 ? 2.9 : 3.4;
  const { doc } = syntheticShot({ captureFps: s.fps / (s.tempo ?? 1), frames: s.frames, noisePx: 0.25, mmPerPx, flex: null, ...s.scene });
  const all = Object.values(doc.tracks).flatMap((t) => t as Mark[]);
  const minX = Math.min(...all.map((m) => m[1]));
  const maxX = Math.max(...all.map((m) => m[1]));
  const dx = 40 - minX;
  if (maxX + dx > W - 20) throw new Error(`${s.key}: the scene is ${Math.round(maxX - minX)} px wide, wider than the frame`);
  const dy = 80;
  const move = (t: Mark[] | undefined) => (t ?? []).map(([f, x, y]) => [f + 1, x + dx, y + dy] as Mark);
  const marks = Object.fromEntries(Object.entries(doc.tracks).filter(([k]) => !s.unmarked?.includes(k)).map(([k, t]) => [k, move(t as Mark[])])) as Record<string, Mark[]>;
  const e = doc.events;
  const events = { iceStrike: e.iceStrike! + 1, puckStrike: e.puckStrike + 1, peakBend: e.peakBend! + 1, release: e.release + 1 };
  const cal = doc.calibration as { a: [number, number]; b: [number, number]; lengthMm: number };
  const calibration = { type: "scaleBar" as const, a: [cal.a[0] + dx, cal.a[1] + dy], b: [cal.b[0] + dx, cal.b[1] + dy], lengthMm: cal.lengthMm, lengthUnit: "mm" as const };
  return { marks, events, calibration, mmPerPx };
}

function frameSvg(marks: Record<string, Mark[]>, n: number, fps: number, strike: number, puckR: number) {
  const at = (k: string) => marks[k]?.find((m) => m[0] === n);
  const [top, bottom, heel, toe, puck] = ["topHand", "bottomHand", "bladeHeel", "bladeToe", "puck"].map(at);
  const iceY = (heel?.[2] ?? 600) + 4;
  const t = (((n - strike) / fps) * 1000).toFixed(2);
  const shaft = top && bottom && heel ? `<polyline points="${top[1]},${top[2]} ${bottom[1]},${bottom[2]} ${heel[1]},${heel[2]}" fill="none" stroke="#3b2a1a" stroke-width="9" stroke-linejoin="round"/>` : "";
  const blade = heel && toe ? `<line x1="${heel[1]}" y1="${heel[2]}" x2="${toe[1]}" y2="${toe[2]}" stroke="#1d1712" stroke-width="12" stroke-linecap="round"/>` : "";
  const hands = [top, bottom].filter(Boolean).map((m) => `<circle cx="${m![1]}" cy="${m![2]}" r="14" fill="#274b6d"/>`).join("");
  const disc = puck ? `<circle cx="${puck[1]}" cy="${puck[2]}" r="${puckR}" fill="#111"/>` : "";
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}"><rect width="${W}" height="${H}" fill="#dfe8ee"/>` +
    `<rect y="${iceY}" width="${W}" height="${H - iceY}" fill="#eef4f7"/><line x1="0" y1="${iceY}" x2="${W}" y2="${iceY}" stroke="#9fb7c6" stroke-width="3"/>` +
    `${shaft}${blade}${hands}${disc}` +
    `<text x="24" y="44" font-family="DejaVu Sans" font-size="28" fill="#33424a">frame ${n} · ${t} ms · ${fps} fps</text></svg>`
  );
}

async function drawFrames(clipId: string, s: Spec, sc: ReturnType<typeof sceneOf>) {
  const puckR = 38.1 / sc.mmPerPx;
  const todo = Array.from({ length: s.frames }, (_, i) => i + 1);
  const workers = Array.from({ length: 6 }, async () => {
    for (let n = todo.shift(); n !== undefined; n = todo.shift()) {
      const jpg = await sharp(Buffer.from(frameSvg(sc.marks, n, s.fps, sc.events.puckStrike, puckR))).jpeg({ quality: 80 }).toBuffer();
      await storage().putStream(clipKeys.frame(clipId, n, "jpg"), Readable.from(jpg), { contentType: "image/jpeg" });
    }
  });
  await Promise.all(workers);
}

async function main() {
  const [team] = await db().select({ id: organization.id }).from(organization).where(eq(organization.slug, DEMO_TEAM.slug));
  if (!team) throw new Error("the demo club is not seeded in this database");
  const out: Record<string, string> = { teamId: team.id };
  for (const s of SPECS) {
    const [p] = await db().select({ id: user.id }).from(user).innerJoin(member, eq(member.userId, user.id)).where(and(eq(user.email, s.playerEmail), eq(member.organizationId, team.id)));
    const [st] = s.stick ? await db().select({ id: stick.id }).from(stick).where(and(eq(stick.teamId, team.id), eq(stick.label, s.stick))) : [];
    const sc = sceneOf(s);
    const [session] = await db().insert(trainingSession).values({ teamId: team.id, date: s.date, venue: "Lakeport Arena, rink 2", drill: "Slap shots from the point" }).returning({ id: trainingSession.id });
    const [c] = await db()
      .insert(clip)
      .values({
        teamId: team.id, sessionId: session.id, playerId: p.id, stickId: st?.id ?? null, title: `${s.label} (made-up clip)`, status: "ready", captureFps: s.fps,
        captureFpsConfirmed: true, storedFps: 30, frameCount: s.frames, framesDone: s.frames, width: W, height: H, shotType: s.shotType ?? "slap",
        originalName: `${s.key}.mp4`, calibration: s.uncalibrated ? null : sc.calibration, frameTimes: Array.from({ length: s.frames }, (_, i) => i / 30),
      })
      .returning({ id: clip.id });
    const [sh] = await db()
      .insert(shot)
      // Published: these are shots their players open (a shot in review is staff-only).
      .values({ teamId: team.id, clipId: c.id, playerId: p.id, stickId: st?.id ?? null, label: s.label, frameStart: 1, frameEnd: s.frames, marks: sc.marks, events: sc.events, publishedAt: new Date() })
      .returning({ id: shot.id });
    if (s.drawFrames) await drawFrames(c.id, s, sc);
    const stored = await recomputeShot(sh.id);
    if (!stored?.results !== !!s.uncalibrated) throw new Error(`${s.key}: results ${stored?.results ? "present" : `missing (${stored?.error})`}`);
    out[s.key] = sh.id;
  }
  process.stdout.write(JSON.stringify(out));
}

await main();
await db().pool.end();
