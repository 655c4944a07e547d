// The shot tracker on generated slap shots (support/shot-clips.ts: the demo's scene renderer with
// motion blur, focus blur, noise, H.264 at a phone's quality, a printed puck spinning from puck
// strike): every landmark seeded on the first frame and followed through the shot, the events
// proposed from the tracks, the scale bar from the puck at rest. Source of truth: the scene's own
// analytic positions and events (scripts/demo/shot-scene.ts), exact by construction.
import { describe, expect, it, vi } from "vitest";
import { computeShot } from "../../../shared/mechanics/compute-shot";
import type { Landmark, Mark } from "../../../shared/schemas/shot-document";
import { proposeEvents } from "../../../shared/tracking/events";
import { trackShot, type ShotTrackResult } from "../../../shared/tracking/shot-tracker";
import { seedsAt, shotClip, TRACK_SHOTS, type ShotClip } from "./support/shot-clips";

// The first run renders the clips (cached in the OS temp folder afterwards).
vi.setConfig({ testTimeout: 300_000 });

const runs = new Map<number, Promise<{ clip: ShotClip; result: ShotTrackResult; marks: Partial<Record<Landmark, Mark[]>> }>>();
function tracked(fps: 240 | 1000 | 3200) {
  if (!runs.has(fps))
    runs.set(
      fps,
      (async () => {
        const clip = await shotClip(TRACK_SHOTS[fps]);
        const seeds = seedsAt(clip.truth, 1);
        const result = await trackShot({ frames: clip.source, first: 1, last: clip.truth.frameCount, seedFrame: 1, seeds });
        const marks: Partial<Record<Landmark, Mark[]>> = {};
        for (const [k, run] of Object.entries(result.tracks) as [Landmark, NonNullable<ShotTrackResult["tracks"][Landmark]>][])
          marks[k] = [[1, ...seeds[k]!] as Mark, ...run.proposals.map((p) => [p.frame, p.x, p.y] as Mark)];
        return { clip, result, marks };
      })(),
    );
  return runs.get(fps)!;
}

describe.each([240, 1000, 3200] as const)("a slap shot at %i fps", (fps) => {
  it("every landmark is followed from the first frame, within 0.5 px on average", async () => {
    const { clip, result } = await tracked(fps);
    const truth = clip.truth;
    for (const [k, run] of Object.entries(result.tracks) as [Landmark, NonNullable<ShotTrackResult["tracks"][Landmark]>][]) {
      const t = new Map(truth.tracks[k].map((m) => [m[0], m]));
      const errors = run.proposals.map((p) => Math.hypot(p.x - t.get(p.frame)![1], p.y - t.get(p.frame)![2]));
      const mean = errors.reduce((a, b) => a + b, 0) / errors.length;
      expect(mean, `${k}: mean error`).toBeLessThan(0.5);
      // Followed while it is in the picture: to the last frame, or to within a few frames of where it leaves.
      const lastTrue = truth.tracks[k].at(-1)![0];
      expect(run.proposals.at(-1)!.frame, `${k}: last frame followed (${run.forward.message})`).toBeGreaterThanOrEqual(Math.min(truth.frameCount, lastTrue - 10));
      if (run.forward.reason !== "end-of-range") expect(run.forward.reason, k).toBe("left-frame");
    }
  });

  it("proposes every event within one frame of the truth", async () => {
    const { clip, marks } = await tracked(fps);
    const events = proposeEvents(marks);
    for (const k of ["iceStrike", "puckStrike", "peakBend", "release"] as const) {
      expect(events[k], k).toBeDefined();
      expect(Math.abs(events[k]!.frame - clip.truth.events[k]), `${k}: proposed ${events[k]!.frame}, truth ${clip.truth.events[k]}`).toBeLessThanOrEqual(1);
      expect(events[k]!.confidence).toBeGreaterThan(0.5);
      expect(events[k]!.evidence).toMatch(/frame \d+/);
    }
  });

  it("puck exit speed from the tracks and the proposed events within 1 % of the truth (the blade touches the puck until release)", async () => {
    const { clip, marks } = await tracked(fps);
    const e = proposeEvents(marks);
    const events = { iceStrike: e.iceStrike!.frame, puckStrike: e.puckStrike!.frame, peakBend: e.peakBend!.frame, release: e.release!.frame };
    const r = computeShot({ captureFps: fps, calibration: clip.truth.scaleBar, tracks: marks, events, frameRange: [1, clip.truth.frameCount] }, { trials: 50 });
    expect(Math.abs(r.puckExitSpeed.valueMps / clip.truth.exitSpeedMps - 1)).toBeLessThan(0.01);
  });

  it("finds the puck at rest and its diameter to 0.3 % for the scale bar", async () => {
    const { clip, result } = await tracked(fps);
    const truePx = 76.2 / clip.truth.mmPerPx;
    expect(result.puck?.doubt).toBeNull();
    expect(Math.abs(result.puck!.widthPx / truePx - 1)).toBeLessThan(0.003);
    const [a, b] = [result.puck!.bar.a, result.puck!.bar.b];
    const [ta, tb] = [clip.truth.scaleBar.a, clip.truth.scaleBar.b];
    expect(Math.hypot(a[0] - ta[0], a[1] - ta[1])).toBeLessThan(0.3);
    expect(Math.hypot(b[0] - tb[0], b[1] - tb[1])).toBeLessThan(0.3);
  });
});

describe("seeds on a frame in the middle of the shot", () => {
  it("tracks back to the first frame and on to the last", async () => {
    const clip = await shotClip(TRACK_SHOTS[1000]);
    const seedFrame = 30;
    const result = await trackShot({ frames: clip.source, first: 1, last: clip.truth.frameCount, seedFrame, seeds: seedsAt(clip.truth, seedFrame) });
    const heel = result.tracks.bladeHeel!;
    expect(heel.backward.reason).toBe("end-of-range");
    expect(heel.forward.reason).toBe("end-of-range");
    expect(heel.proposals[0].frame).toBe(1);
    expect(heel.proposals.at(-1)!.frame).toBe(clip.truth.frameCount);
    expect(heel.proposals.some((p) => p.frame === seedFrame)).toBe(false);
    const t = new Map(clip.truth.tracks.bladeHeel.map((m) => [m[0], m]));
    const mean = heel.proposals.reduce((a, p) => a + Math.hypot(p.x - t.get(p.frame)![1], p.y - t.get(p.frame)![2]), 0) / heel.proposals.length;
    expect(mean).toBeLessThan(0.5);
  });
});

describe("bad seeds", () => {
  it("a seed outside the picture or a seed frame outside the shot is refused with the field named", async () => {
    const clip = await shotClip(TRACK_SHOTS[240]);
    const req = { frames: clip.source, first: 1, last: 44 };
    await expect(trackShot({ ...req, seedFrame: 1, seeds: { puck: [5000, 10] } })).rejects.toThrow(/seeds\.puck: \(5000, 10\) lies outside the 1280×720 frame/);
    await expect(trackShot({ ...req, seedFrame: 60, seeds: { puck: [500, 10] } })).rejects.toThrow(/seedFrame: frame 60 is outside the shot's frames 1–44/);
    await expect(trackShot({ ...req, seedFrame: 1, seeds: {} })).rejects.toThrow(/seeds: place at least one landmark/);
  });

  it("cancelling stops the run with an AbortError", async () => {
    const clip = await shotClip(TRACK_SHOTS[240]);
    const abort = new AbortController();
    const run = trackShot({ frames: clip.source, first: 1, last: 44, seedFrame: 1, seeds: seedsAt(clip.truth, 1), signal: abort.signal }, (p) => p.done > 20 && abort.abort());
    await expect(run).rejects.toMatchObject({ name: "AbortError" });
  });
});
