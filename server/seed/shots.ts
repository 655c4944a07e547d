// Demo clips with digitised shots for the made-up club. The clips are synthetic side-view slap
// shots (scripts/demo/shot-scene.ts) rendered to MP4 and taken through the real clip pipeline
// (ingest, then frame extraction in-process); the marks are the scenes' truth plus a digitiser's
// scatter, so the stored results are close to the scenes' known speeds. Idempotent: a clip is
// found by its title, a shot by its label in that clip.
import { copyFile, mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { db } from "../db/client";
import { clip, shot, stick } from "../db/schema";
import { log } from "../log";
import { ingestUpload } from "../clips/ingest";
import { extractClip } from "../jobs/clip-extract";
import { ClipMetaSchema, type ClipMetaInput } from "../../shared/schemas/clips";
import { normalSource } from "../../shared/mechanics/uncertainty";
import { LANDMARKS, type ShotMarks } from "../../shared/schemas/shots";
import { DEMO_CLIPS, DEMO_SESSION, type DemoClip } from "../../scripts/demo/demo-scenes";
import { clipTruth, renderClip } from "../../scripts/demo/render-scene";
import type { SceneOptions, SceneTruth } from "../../scripts/demo/shot-scene";
import * as repo from "../entities/shot/repository";
import { clipForShots, setClipCalibration } from "../entities/clip/repository";
import { recomputeShot } from "../shots/results";
import { DEMO_STICK_LABELS } from "./sticks";
import type { DemoIds } from "./demo-people";

/** Standard deviation of a demo digitiser's clicks, px. */
export const CLICK_SCATTER_PX = 0.35;

async function clipByTitle(teamId: string, title: string) {
  const [row] = await db().select({ id: clip.id, status: clip.status }).from(clip).where(and(eq(clip.teamId, teamId), eq(clip.title, title)));
  return row ?? null;
}

async function stickId(teamId: string, which: DemoClip["stick"]) {
  const [row] = await db().select({ id: stick.id }).from(stick).where(and(eq(stick.teamId, teamId), eq(stick.label, DEMO_STICK_LABELS[which])));
  return row?.id ?? null;
}

/** Footage rendered from scenes, taken through the same ingest (and extraction) as an upload. */
export async function ingestDemoClip(r: { teamId: string; userId: string; scenes: SceneOptions[]; meta: ClipMetaInput; extract: boolean }) {
  const rendered = await renderClip(r.scenes);
  const tmp = await mkdtemp(path.join(os.tmpdir(), "loadframe-seed-"));
  try {
    const file = path.join(tmp, "clip.mp4");
    await copyFile(rendered.mp4, file);
    const meta = ClipMetaSchema.parse(r.meta);
    const row = await ingestUpload({ teamId: r.teamId, userId: r.userId, file, originalName: `${meta.title.replace(/[^\w]+/g, "-").toLowerCase()}.mp4`, meta, enqueue: false });
    if (!r.extract) return { id: row.id, outcome: row.status };
    return { id: row.id, outcome: await extractClip(row.id, { log, lastAttempt: true, notify: false }) };
  } finally {
    await rm(tmp, { recursive: true, force: true });
  }
}

/** The demo clip through the same ingest and extraction as an upload. */
async function ensureClip(ids: DemoIds, dc: DemoClip): Promise<string | null> {
  const found = await clipByTitle(ids.teamId, dc.title);
  if (found) return found.status === "ready" ? found.id : null;
  const { id, outcome } = await ingestDemoClip({
    teamId: ids.teamId, userId: ids.users["analyst@ravens.example"], scenes: dc.shots.map((s) => s.scene), extract: true,
    meta: {
      title: dc.title, newSession: DEMO_SESSION, playerId: ids.users[dc.playerEmail], shotType: "slap", stickId: await stickId(ids.teamId, dc.stick),
      cameraView: "side", captureFps: dc.captureFps, captureFpsConfirmed: true, notes: dc.notes,
    },
  });
  return outcome === "ready" ? id : null;
}

/** A digitiser's clicks on a scene's truth: every landmark on every frame, scattered by `jitter`. */
export function scatteredMarks(t: SceneTruth, jitter: (v: number) => number): ShotMarks {
  const marks: ShotMarks = {};
  for (const k of LANDMARKS) marks[k] = t.tracks[k].map(([f, x, y]) => [f, jitter(x), jitter(y)]);
  return marks;
}

/** A scale bar across the puck of a scene's first frame, as a person would click it. */
export async function calibrateDemoClip(clipId: string, t: SceneTruth, jitter: (v: number) => number) {
  const bar = t.scaleBar;
  await setClipCalibration(clipId, { type: "scaleBar", a: [jitter(bar.a[0]), jitter(bar.a[1])], b: [jitter(bar.b[0]), jitter(bar.b[1])], lengthMm: bar.lengthMm, lengthUnit: "mm" });
}

async function shotByLabel(clipId: string, label: string) {
  const [row] = await db().select({ id: shot.id }).from(shot).where(and(eq(shot.clipId, clipId), eq(shot.label, label)));
  return row ?? null;
}

export async function seedDemoShots(ids: DemoIds) {
  const analyst = ids.users["analyst@ravens.example"];
  for (const dc of DEMO_CLIPS) {
    const clipId = await ensureClip(ids, dc);
    if (!clipId) {
      log.warn({ title: dc.title }, "demo clip is not ready; its shots were not seeded");
      continue;
    }
    const truths = clipTruth(dc.shots.map((s) => s.scene));
    const noise = normalSource(`demo:${dc.title}`);
    const jitter = (v: number) => v + CLICK_SCATTER_PX * noise();
    const c = await clipForShots(ids.teamId, clipId);
    if (c && !c.calibration) await calibrateDemoClip(clipId, truths[0], jitter);
    for (const [i, s] of dc.shots.entries()) {
      if (await shotByLabel(clipId, s.label)) continue;
      const t = truths[i];
      const id = await repo.insertShot({
        teamId: ids.teamId, clipId, label: s.label, frameStart: t.firstFrame, frameEnd: t.lastFrame,
        playerId: ids.users[dc.playerEmail], stickId: await stickId(ids.teamId, dc.stick), userId: analyst,
      });
      if (s.digitised) await repo.saveMarks(id, 1, scatteredMarks(t, jitter), t.events, analyst);
      await recomputeShot(id);
      // The demo's digitised shots have been reviewed: their players see them.
      if (s.digitised) await db().update(shot).set({ publishedAt: new Date(), publishedBy: ids.users["coach@ravens.example"] }).where(eq(shot.id, id));
    }
  }
}

/** Demo-data steps for this area, run in order after the people; each must be idempotent. */
export const shotsSeedSteps: { name: string; run: (ids: DemoIds) => Promise<void> }[] = [{ name: "demo clips with digitised shots", run: seedDemoShots }];
