// Where the assist stops, and that it says why: a hidden disc, a disc leaving the frame, maxFrames,
// cancellation. Source of truth: the generator's own formula (support/synthetic-clips.ts).
import { describe, expect, it, vi } from "vitest";
import { track } from "../../../shared/tracking/track";
import { errorStats } from "./support/metrics";
import { grazedClip, HIDDEN_FROM, HIDDEN_TO, leavingClip, occludedClip } from "./support/scenarios";
import { memorySource } from "./support/synthetic-clips";
import { framesOf } from "./support/track-clip";

// Each clip is rendered by ffmpeg first: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

describe("a disc hidden behind a box for ten frames", () => {
  const spec = occludedClip();

  it.each([
    [1, 0, HIDDEN_FROM],
    [-1, 259, HIDDEN_TO],
  ] as const)("direction %i: stops at the first hidden frame with low confidence, and was right until then", async (direction, from, stopAt) => {
    const frames = await framesOf(spec);
    const { proposals, stop } = await track({ frames: memorySource(frames), start: { frame: from, ...spec.truth(from) }, direction });
    expect(stop.reason).toBe("low-confidence");
    expect(stop.frame).toBe(stopAt);
    expect(stop.confidence).toBeLessThan(0.6);
    expect(stop.message).toContain(`frame ${stopAt}`);
    expect(proposals.at(-1)!.frame).toBe(stopAt - direction);
    expect(proposals.every((p) => p.frame < HIDDEN_FROM || p.frame > HIDDEN_TO)).toBe(true);
    expect(errorStats(proposals, spec.truth).max).toBeLessThan(1);
    // Visible frames score far above the threshold, the hidden one far below: the stop is clear-cut.
    expect(Math.min(...proposals.map((p) => p.confidence))).toBeGreaterThan(0.85);
  });
});

describe("a box over the disc's edge for ten frames", () => {
  it.each([true, false])("turning %s: the disc is found again, exactly, once the box has gone", async (turning) => {
    const spec = grazedClip();
    const frames = await framesOf(spec);
    const { proposals, stop } = await track({ frames: memorySource(frames), start: { frame: 0, ...spec.truth(0) }, direction: 1, turning });
    expect(stop.reason).toBe("end-of-range");
    const after = proposals.filter((p) => p.frame > HIDDEN_TO);
    // The look learnt while the box grazed the disc is dropped for the analyst's own template.
    expect(errorStats(after, spec.truth).max).toBeLessThan(0.5);
    expect(Math.min(...after.map((p) => p.confidence))).toBeGreaterThan(0.9);
  });
});

describe("a fast disc leaving through the right edge", () => {
  const spec = leavingClip();

  it.each([
    ["from one mark", false],
    ["with a second mark for the first velocity", true],
  ])("%s: follows it to the edge, then stops with left-frame", async (_, withPrior) => {
    const frames = await framesOf(spec);
    const { proposals, stop } = await track({
      frames: memorySource(frames),
      start: { frame: 0, ...spec.truth(0) },
      prior: withPrior ? { frame: 1, ...spec.truth(1) } : undefined,
      direction: 1,
    });
    expect(stop.reason).toBe("left-frame");
    expect(errorStats(proposals, spec.truth).max).toBeLessThan(1);
    // The disc (radius 10) is still whole at x ≤ 310: it is followed at least to 300.
    expect(proposals.at(-1)!.x).toBeGreaterThan(300);
    expect(spec.truth(stop.frame!).x).toBeGreaterThan(300);
  });
});

describe("cancellation", () => {
  it("stops with cancelled when the signal fires, keeping what was proposed", async () => {
    const spec = occludedClip();
    const frames = await framesOf(spec);
    const controller = new AbortController();
    const seen: number[] = [];
    const { proposals, stop } = await track(
      { frames: memorySource(frames), start: { frame: 0, ...spec.truth(0) }, direction: 1, signal: controller.signal },
      ({ done, total, proposal }) => {
        seen.push(done);
        expect(total).toBe(259);
        expect(proposal.frame).toBe(done);
        if (done === 5) controller.abort();
      },
    );
    expect(stop.reason).toBe("cancelled");
    expect(proposals).toHaveLength(5);
    expect(seen).toEqual([1, 2, 3, 4, 5]);
  });

  it("answers cancelled at once for a signal that already fired", async () => {
    const { stop, proposals } = await track({
      frames: { length: 3, frame: () => Promise.reject(new Error("must not be read")) },
      start: { frame: 0, x: 50, y: 50 },
      direction: 1,
      signal: AbortSignal.abort(),
    });
    expect(stop.reason).toBe("cancelled");
    expect(proposals).toEqual([]);
  });
});
