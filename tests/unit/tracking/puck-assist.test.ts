// Where the single-landmark assist failed before (issue 17): the puck beside the blade at release
// with a print turning on it, and a first step larger than the search window (a puck struck from
// rest). Sources of truth: the scene's analytic puck path (scripts/demo/shot-scene.ts) and the
// disc generator's own formula (support/synthetic-clips.ts).
import { describe, expect, it, vi } from "vitest";
import { track } from "../../../shared/tracking/track";
import { errorStats } from "./support/metrics";
import { shotClip, TRACK_SHOTS } from "./support/shot-clips";
import { discClip, memorySource, type Path } from "./support/synthetic-clips";
import { framesOf } from "./support/track-clip";

vi.setConfig({ testTimeout: 300_000 });

describe("the puck beside the blade at 3,200 fps, a print spinning on it from puck strike", () => {
  it("followed by its outline through contact and flight within 0.5 px on average, no step off by 2 px", async () => {
    const clip = await shotClip(TRACK_SHOTS[3200]);
    const t = new Map(clip.truth.tracks.puck.map((m) => [m[0], m]));
    const start = t.get(1)!;
    const { proposals, stop } = await track({ frames: clip.source, start: { frame: 1, x: start[1], y: start[2] }, direction: 1, object: "puck" });
    const { puckStrike, release } = clip.truth.events;
    expect(proposals.at(-1)!.frame, stop.message).toBeGreaterThan(release + 40);
    const truth = (f: number) => ({ x: t.get(f)![1], y: t.get(f)![2] });
    const stats = errorStats(proposals, truth);
    expect(stats.mean).toBeLessThan(0.5);
    expect(stats.max).toBeLessThan(2);
    // No lag building up beside the blade: contact and the first flight frames as good as the rest.
    const contact = errorStats(proposals.filter((p) => p.frame > puckStrike && p.frame <= release + 10), truth);
    expect(contact.mean).toBeLessThan(0.5);
  });
});

/** Still for 0.1 s (frames 0–24), then off at 10,800 px/s (45 px a frame at 240 fps): the first step is far outside an 8 px window. */
const struck: Path = {
  at: (t) => ({ x: t < 0.1 ? 120 : 120 + 10_800 * (t - 0.1), y: 120 }),
  expr: (v) => ({ x: `if(lt(${v},0.1),120,120+10800*(${v}-0.1))`, y: "120" }),
};

describe("a disc struck from rest: the first step is larger than the search window", () => {
  it("is found by one wider search and followed to the end of the clip", async () => {
    const spec = discClip("struck-240", struck, { fps: 240, frames: 36, noise: 20, width: 640, height: 240 });
    const frames = await framesOf(spec);
    const { proposals, stop } = await track({ frames: memorySource(frames), start: { frame: 0, ...spec.truth(0) }, direction: 1, turning: false });
    expect(stop.reason, stop.message).toBe("end-of-range");
    expect(proposals.filter((p) => p.frame > 24)).toHaveLength(11);
    expect(errorStats(proposals, spec.truth).max).toBeLessThan(1);
  });
});
