// Coarse container clocks snap onto the frame grid; only real gaps and repeats stay (issue 15).
// Times here are what containers write (rounded to their clock), worked out by hand:
// QuickTime time scale 600 at 240 fps, Matroska's 1 ms clock at 1,200 and 2,000 fps.
import { describe, expect, it } from "vitest";
import { analyseTiming } from "../../../server/media/timing";

const ticks = (n: number, fps: number, tick: number, gaps: Record<number, number> = {}) => {
  const out: number[] = [];
  let slot = 0;
  for (let i = 1; i <= n; i++) {
    out.push(Math.round(slot / fps / tick) * tick);
    slot += 1 + (gaps[i] ?? 0);
  }
  return out.map((s) => Math.round((s - out[0]) * 1e6) / 1e6);
};

describe("analyseTiming", () => {
  it("a 600 time scale at 240 fps (3.33/5.00 ms steps) snaps to 4.1667 ms", () => {
    const raw = ticks(240, 240, 1 / 600);
    expect(new Set(raw.slice(1).map((v, i) => Math.round((v - raw[i]) * 1e5)))).toEqual(new Set([333, 500]));
    const r = analyseTiming(raw, 1 / 600, [240, 144000 / 601]);
    expect(r.timing.clock).toBe("snapped");
    expect(r.timing.nominalFps).toBe(240);
    expect(r.timing.gapCount + r.timing.repeatCount).toBe(0);
    r.times.forEach((t, i) => expect(t).toBeCloseTo(i / 240, 6));
  });

  it("Matroska's millisecond clock at 1,200 fps: the real rate, not 1000, and no repeats", () => {
    const raw = ticks(600, 1200, 0.001);
    expect(raw.slice(1).some((v, i) => v === raw[i])).toBe(true);
    const r = analyseTiming(raw, 0.001, [1000]);
    expect(r.timing.nominalFps).toBe(1200);
    expect(r.timing.repeatCount).toBe(0);
    expect(r.times[599]).toBeCloseTo(599 / 1200, 6);
  });

  it("2,000 fps in WebM, no stated rate", () => {
    const r = analyseTiming(ticks(1000, 2000, 0.001), 0.001);
    expect(r.timing.nominalFps).toBe(2000);
    expect(r.timing.clock).toBe("snapped");
  });

  it("real gaps stay and are listed by frame; the rate is the grid's, not the average", () => {
    const raw = ticks(480, 240, 1 / 600, { 100: 3, 300: 1 });
    const r = analyseTiming(raw, 1 / 600, [240, (479 / raw[479])]);
    expect(r.timing.nominalFps).toBe(240);
    expect(r.timing.gaps).toEqual([
      { after: 100, missing: 3 },
      { after: 300, missing: 1 },
    ]);
    expect(r.times[100] - r.times[99]).toBeCloseTo(4 / 240, 6);
  });

  it("a gap on a fine clock with no stated rate", () => {
    const raw = ticks(300, 120, 1 / 90000, { 50: 2 });
    const r = analyseTiming(raw, 1 / 90000);
    expect(r.timing.clock).toBe("even");
    expect(r.timing.nominalFps).toBeCloseTo(120, 6);
    expect(r.timing.gaps).toEqual([{ after: 50, missing: 2 }]);
  });

  it("29.97 fps (30000/1001) is found from its ticks", () => {
    const raw = ticks(300, 30000 / 1001, 1 / 1000);
    const r = analyseTiming(raw, 1 / 1000);
    expect(r.timing.nominalFps).toBeCloseTo(30000 / 1001, 9);
  });

  it("an uneven clock finer than its unevenness is kept as it is; a long step is a gap", () => {
    const raw = [0, 0.0331, 0.0668, 0.1001, 0.1329, 0.1998, 0.2334, 0.2667, 0.3001];
    const r = analyseTiming(raw, 1 / 90000);
    expect(r.timing.clock).toBe("uneven");
    expect(r.times).toEqual(raw);
    expect(r.timing.gaps).toEqual([{ after: 5, missing: 1 }]);
  });

  it("two frames at one instant on a fine clock are a repeat; on a clock coarser than a frame they cannot be told apart", () => {
    const raw = [0, 1, 2, 3, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12].map((k) => k / 100);
    expect(analyseTiming(raw, 1 / 90000, [100]).timing.repeats).toEqual([5]);
    expect(analyseTiming(ticks(600, 1200, 0.001), 0.001).timing.repeatCount).toBe(0);
  });
});
