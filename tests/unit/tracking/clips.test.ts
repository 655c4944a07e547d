// The test clips themselves: noise-free renders must put each shape where its formula says.
// Source of truth: the generator's own formula (support/synthetic-clips.ts); ffmpeg renders it.
import { describe, expect, it, vi } from "vitest";
import { centroid, renderGray, type ClipSpec } from "./support/synthetic-clips";
import { arcClip, lineClip, shaftClip } from "./support/scenarios";

// Each clip is rendered by ffmpeg first: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

async function worstCentroidError(spec: ClipSpec, expected: (n: number) => { x: number; y: number }) {
  const frames = await renderGray(spec);
  let worst = 0;
  for (let n = 0; n < frames.length; n++) {
    const bg = frames[n].data[0];
    const c = centroid(frames[n], bg);
    const e = expected(n);
    worst = Math.max(worst, Math.hypot(c.x - e.x, c.y - e.y));
  }
  return worst;
}

describe("synthetic clips", () => {
  it.each([240, 1000])("a disc on a line at %i fps is drawn where its formula puts it", async (fps) => {
    const spec = lineClip(fps, 120, 0);
    expect(await worstCentroidError(spec, spec.truth)).toBeLessThan(0.02);
  });

  it("a disc on an arc is drawn where its formula puts it", async () => {
    const spec = arcClip(240, 120, 0);
    expect(await worstCentroidError(spec, spec.truth)).toBeLessThan(0.02);
  });

  // ffmpeg's rotate filter resamples in fixed point: near 45° the drawn bar is off by up to ~0.1 px,
  // a tenth of what the tracker is allowed.
  it("the turning bar's centre is half its length from the pivot along the formula's angle", async () => {
    const spec = shaftClip(240, 120, 0);
    // Centroid of a uniform bar from the pivot to 80 px: 40 px out along the bar's angle.
    const half = (n: number) => {
      const q = spec.truth(n);
      return { x: 160 + ((q.x - 160) * 40) / 68, y: 120 + ((q.y - 120) * 40) / 68 };
    };
    expect(await worstCentroidError(spec, half)).toBeLessThan(0.15);
  });
});
