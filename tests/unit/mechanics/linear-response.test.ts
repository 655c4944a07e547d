// The Monte Carlo trials read smoothed positions and velocities as weighted sums of the marks
// (docs/decisions/011-uncertainty-monte-carlo.md). Checked here against the operator itself: the
// adjoint equals the filter's impulse responses, the weights reproduce the smoothing through gaps,
// and the sampled spread equals brute-force re-smoothing of noisy marks. [calc], no outside source.
import { describe, expect, it } from "vitest";
import { endPadLength, filtfilt, gridSegments, normalSource, scaleBarMap, smoothSegment, zeroLagDesign } from "../../../shared/mechanics/index";
import { filtfiltAdjoint, linearState, stateWeights } from "../../../shared/mechanics/linear-response";
import { velocityAt } from "../../../shared/mechanics/track-smoothing";

describe("linear response of the smoothing", () => {
  it("filtfiltAdjoint is the transpose of filtfilt (with padding, short and long)", () => {
    const q = zeroLagDesign(100, 1000);
    for (const n of [4, 40]) {
      const pad = endPadLength(q);
      for (let i = 0; i < n; i++) {
        const e = new Float64Array(n);
        e[i] = 1;
        const row = filtfiltAdjoint(q, e, pad);
        for (let k = 0; k < n; k++) {
          const ek = new Float64Array(n);
          ek[k] = 1;
          expect(Math.abs(filtfilt(q, ek, pad)[i] - row[k])).toBeLessThan(1e-12);
        }
      }
    }
  });

  it("state weights reproduce smoothed position and velocity across gaps", () => {
    const frames = Int32Array.from([0, 1, 2, 4, 5, 8, 9, 10, 11, 12, 15, 16, 17, 18, 19, 20]);
    const x = Float64Array.from(frames, (f) => 10 * Math.sin(f / 3) + f);
    const y = Float64Array.from(frames, (f) => Math.cos(f / 4));
    const [g] = gridSegments({ frames, x, y }, [], ["beforeStrike"], 100);
    expect(g.filled).toBe(5);
    const s = smoothSegment(g, 20);
    for (let i = 0; i < s.frames.length; i++) {
      const w = stateWeights(s, i);
      let p = 0;
      let v = 0;
      for (let k = 0; k < x.length; k++) {
        p += w.pos[k] * x[k];
        v += w.vel![k] * x[k];
      }
      expect(p).toBeCloseTo(s.sx[i], 10);
      expect(v).toBeCloseTo(velocityAt(s, i)[0], 8);
    }
  });

  it("sampled velocity spread equals re-smoothing noisy marks (brute force)", () => {
    const fps = 1000;
    const sigma = 0.5;
    const n = 80;
    const px = Float64Array.from({ length: n }, (_, i) => 100 + 3 * i + 0.02 * i * i);
    const py = Float64Array.from({ length: n }, (_, i) => 300 - i);
    const frames = Int32Array.from({ length: n }, (_, i) => i);
    const cal = scaleBarMap([0, 0], [40, 0], 76.2);
    const src = { key: "blade" as const, parts: [{ frames, x: px, y: py }], names: ["bladeHeel"] };
    const world = (nx: Float64Array, ny: Float64Array) => ({ frames, x: nx.map((v) => v * cal.mmPerPx!), y: ny.map((v) => -v * cal.mmPerPx!) });
    const [seg] = gridSegments(world(px, py), [], ["beforeStrike"], fps).map((g) => smoothSegment(g, 40));
    const state = linearState(src, seg, n - 1, cal, sigma);

    const normal = normalSource("brute-force");
    const viaWeights: number[] = [];
    const brute: number[] = [];
    for (let t = 0; t < 3000; t++) {
      viaWeights.push(state.sample(cal, normal).vx);
      const [g] = gridSegments(world(px.map((v) => v + sigma * normal()), py.map((v) => v + sigma * normal())), [], ["beforeStrike"], fps);
      const s = smoothSegment(g, 40);
      brute.push(velocityAt(s, n - 1)[0]);
    }
    const sd = (a: number[]) => {
      const m = a.reduce((p, c) => p + c, 0) / a.length;
      return Math.sqrt(a.reduce((p, c) => p + (c - m) ** 2, 0) / (a.length - 1));
    };
    expect(Math.abs(sd(viaWeights) / sd(brute) - 1)).toBeLessThan(0.06);
  });
});
