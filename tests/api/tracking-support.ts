// Shared by the tracking API tests: a generated slap shot (tests/unit/tracking/support/shot-clips.ts)
// uploaded and extracted like any clip, a shot over it, and the run's life through the API.
import { clipMeta, tusUpload, waitFor } from "./clips-support";
import { copyFileSync, mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { expect } from "vitest";
import { renderClip } from "../../scripts/demo/render-scene";
import type { SceneOptions } from "../../scripts/demo/shot-scene";
import { TRACK_LOOKS, TRACK_SHOTS } from "../unit/tracking/support/shot-clips";
import type { Client } from "./helpers";

export async function renderedShot(fps: 240 | 1000 | 3200 = 240, over: Partial<SceneOptions> = {}) {
  const scene = { ...TRACK_SHOTS[fps], ...over };
  const r = await renderClip([scene], { look: TRACK_LOOKS[fps] });
  // ingest moves the file it is given: a private copy per upload
  const file = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-track-")), "shot.mp4");
  copyFileSync(r.mp4, file);
  return { file, truth: r.scenes[0] };
}

export async function uploadReadyClip(base: string, who: Client, teamId: string, playerId: string, file: string, captureFps: number) {
  const meta = clipMeta({ playerId, title: `Tracking fixture ${captureFps} fps`, captureFps, captureFpsConfirmed: true });
  const r = await tusUpload(base, who, file, { teamId, filename: path.basename(file), meta: JSON.stringify(meta) });
  expect(r.ok, JSON.stringify(r.body)).toBe(true);
  const id = r.body.clip.id as string;
  await waitFor("clip ready", async () => {
    const c = (await who.get(`/api/teams/${teamId}/clips/${id}`)).json;
    if (c.status === "failed") throw new Error(c.failureReason);
    return c.status === "ready";
  }, 120_000);
  return id;
}

export async function newShot(who: Client, teamId: string, clipId: string, frameEnd: number) {
  const r = await who.post(`/api/teams/${teamId}/clips/${clipId}/shots`, { frameStart: 1, frameEnd });
  expect(r.status, r.text).toBe(201);
  return r.json.id as string;
}

/** Publishes a shot to its player (a shot in review is staff-only: tests/api/shot-publishing.test.ts). */
export async function publish(who: Client, teamId: string, shotId: string) {
  const r = await who.put(`/api/teams/${teamId}/readout/shots/${shotId}/publication`, { notify: false });
  expect(r.status, r.text).toBe(200);
}

/** Seeds = the scene's truth on `frame`. */
export function seedsOf(truth: { tracks: Record<string, [number, number, number][]> }, frame: number) {
  const seeds: Record<string, [number, number]> = {};
  for (const [k, t] of Object.entries(truth.tracks)) {
    const m = t.find((q) => q[0] === frame);
    if (m) seeds[k] = [m[1], m[2]];
  }
  return seeds;
}

export async function runOf(who: Client, teamId: string, shotId: string) {
  return (await who.get(`/api/teams/${teamId}/shots/${shotId}/tracking`)).json.run;
}

export function untilFinished(who: Client, teamId: string, shotId: string, timeoutMs = 120_000) {
  return waitFor("tracking finished", async () => {
    const run = await runOf(who, teamId, shotId);
    return run && !["queued", "running"].includes(run.status) && run;
  }, timeoutMs);
}
