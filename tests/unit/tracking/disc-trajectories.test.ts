// A disc (the puck) tracked over 500 noisy frames against its known trajectory.
// Source of truth: the generator's own formula (support/synthetic-clips.ts, checked in clips.test.ts).
import { describe, expect, it, vi } from "vitest";
import { arcClip, growingClip, lineClip } from "./support/scenarios";
import { expectAccurateThroughout } from "./support/metrics";
import { trackClip } from "./support/track-clip";

// Each clip is rendered by ffmpeg first: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

describe.each([240, 1000])("a disc at %i fps with noise, over 500 frames", (fps) => {
  it.each([
    ["on a straight line", lineClip],
    ["on an arc", arcClip],
  ])("%s: mean error under 1 px and no drift", async (_, clip) => {
    const { result, stats } = await trackClip(clip(fps));
    expectAccurateThroughout(result.stop, stats, 500, expect);
  });
});

describe("a disc on an arc at 240 fps", () => {
  it("is tracked backwards from the last frame as well as forwards", async () => {
    const { result, stats } = await trackClip(arcClip(240), { direction: -1 });
    expect(result.stop.reason).toBe("end-of-range");
    expect(result.proposals.slice(0, 3).map((p) => p.frame)).toEqual([498, 497, 496]);
    expect(stats.mean).toBeLessThan(1);
  });

  it("is tracked as well without the turning search (what a puck needs)", async () => {
    const { stats } = await trackClip(arcClip(240), { turning: false });
    expect(stats.mean).toBeLessThan(1);
    expect(stats.tailMean).toBeLessThan(1);
  });

  it("stops after maxFrames proposals", async () => {
    const { result } = await trackClip(arcClip(240), { maxFrames: 25 });
    expect(result.proposals.map((p) => p.frame)).toEqual(Array.from({ length: 25 }, (_, i) => i + 1));
    expect(result.stop).toMatchObject({ reason: "end-of-range", frame: null });
  });
});

describe("a disc that grows from 6 to 13 px radius (coming towards the camera)", () => {
  it("is followed by renewing the template as its look changes", async () => {
    const { result, stats } = await trackClip(growingClip());
    expectAccurateThroughout(result.stop, stats, 500, expect);
    // Renewed templates keep the score up even though the disc has doubled in size.
    expect(result.proposals.at(-1)!.confidence).toBeGreaterThan(0.9);
  });
});
