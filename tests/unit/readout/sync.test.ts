// Side by side: two clips stepped together in time, synced at puck strike. The nearest frame is
// checked against a brute-force search over every frame of the clip ([CP] nearest neighbour).
import { describe, expect, it } from "vitest";
import { frameAtStep, stepNearest, stepTimeMs, syncPlan, type ClipClock } from "../../../src/features/compare/lib/sync";

const fast: ClipClock = { fps: 3200, strike: 131, first: 1, last: 300 };
const slow: ClipClock = { fps: 1000, strike: 51, first: 1, last: 120 };
const msOf = (c: ClipClock, f: number) => ((f - c.strike) / c.fps) * 1000;

function bruteNearest(c: ClipClock, tMs: number) {
  let best = c.first;
  for (let f = c.first; f <= c.last; f++) if (Math.abs(msOf(c, f) - tMs) < Math.abs(msOf(c, best) - tMs) - 1e-12) best = f;
  return best;
}

describe("sync plan", () => {
  it("one step is one frame of the faster clip, and the steps cover both shots", () => {
    const p = syncPlan(fast, slow);
    expect(p.stepMs).toBeCloseTo(1000 / 3200, 12);
    expect(stepTimeMs(p, p.kMin)).toBeLessThanOrEqual(Math.min(msOf(fast, fast.first), msOf(slow, slow.first)));
    expect(stepTimeMs(p, p.kMax)).toBeGreaterThanOrEqual(Math.max(msOf(fast, fast.last), msOf(slow, slow.last)));
    expect(syncPlan(slow, fast)).toEqual(p);
  });

  it("over 50 steps: the fast clip moves one frame per step, the slow one shows its nearest frame in time", () => {
    const p = syncPlan(fast, slow);
    let prev = frameAtStep(fast, p, 0).frame;
    expect(prev).toBe(fast.strike);
    expect(frameAtStep(slow, p, 0).frame).toBe(slow.strike);
    for (let k = 1; k <= 50; k++) {
      const t = stepTimeMs(p, k);
      const a = frameAtStep(fast, p, k);
      const b = frameAtStep(slow, p, k);
      expect(a.frame - prev).toBe(1);
      prev = a.frame;
      expect(Math.abs(a.tMs - t)).toBeLessThan(1e-9);
      // Nearest in time: within half a frame of the slow clip, and the same frame a full search finds.
      expect(Math.abs(b.tMs - t)).toBeLessThanOrEqual(0.5 + 1e-9);
      if (Math.abs(Math.abs(b.tMs - t) - 0.5) > 1e-9) expect(b.frame).toBe(bruteNearest(slow, t));
    }
    // Not matched in frame count: after 50 steps the slow clip has moved 16 frames, not 50.
    expect(frameAtStep(slow, p, 50).frame - slow.strike).toBe(16);
  });

  it("equal rates step both by one frame; beyond a shot its end frame is held and flagged", () => {
    const a: ClipClock = { fps: 1000, strike: 40, first: 1, last: 80 };
    const b: ClipClock = { fps: 1000, strike: 20, first: 1, last: 120 };
    const p = syncPlan(a, b);
    expect(frameAtStep(b, p, 7).frame).toBe(27);
    expect(frameAtStep(a, p, 7).frame).toBe(47);
    expect(frameAtStep(a, p, 60)).toMatchObject({ frame: 80, outside: "after" });
    expect(frameAtStep(b, p, -30)).toMatchObject({ frame: 1, outside: "before" });
    expect(frameAtStep(a, p, -30).outside).toBeNull();
    expect(p.kMin).toBe(-39);
    expect(p.kMax).toBe(100);
  });

  it("a time picked on a chart goes to the nearest step inside the plan", () => {
    const p = syncPlan(fast, slow);
    expect(stepNearest(p, 1.0)).toBe(3); // 1.0 ms ÷ 0.3125 ms = 3.2
    expect(stepNearest(p, -1e6)).toBe(p.kMin);
    expect(stepNearest(p, 1e6)).toBe(p.kMax);
  });
});
