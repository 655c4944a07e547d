// The marked events' own uncertainty (±e frames, uniform: GUM 4.3.7 [P]) in the results read at
// them. [calc] the synthetic shot's truth is closed-form; the trapezoid's quantiles are checked
// against a seeded simulation of two uniforms.
import { describe, expect, it } from "vitest";
import { computeShot, syntheticShot, uniformSource } from "../../../shared/mechanics/index";
import { betweenEvents } from "../../../shared/mechanics/event-timing";

describe("times between two events", () => {
  it("u and the 95 % interval of the sum of two uniforms (±a, ±b) match a simulation", () => {
    const uni = uniformSource("two-uniforms");
    for (const [a, b] of [
      [1, 1],
      [1, 0.4],
      [2, 0.05],
    ]) {
      const s = betweenEvents(0, a, b);
      const N = 200_000;
      const xs = Float64Array.from({ length: N }, () => a * (2 * uni() - 1) + b * (2 * uni() - 1)).sort();
      const sd = Math.sqrt(xs.reduce((p, x) => p + x * x, 0) / N);
      expect(s.u).toBeCloseTo(sd, 2);
      expect(s.interval95[1]).toBeCloseTo(xs[Math.floor(0.975 * N)], 2);
    }
  });

  it("contact and load time carry ±e frames of each event; e = 0 leaves them exact", () => {
    const { doc } = syntheticShot({ captureFps: 1000, frames: 300 });
    const r = computeShot(doc, { trials: 40, series: false });
    expect(r.contactTimeUncertaintyMs).toBeCloseTo(Math.sqrt(2 / 3), 6); // two events, ±1 ms each
    expect(r.loadTimeInterval95Ms![1] - r.loadTimeMs!).toBeCloseTo(2 - Math.sqrt(0.2), 6);
    const exact = computeShot({ ...doc, eventErrorFrames: 0 }, { trials: 40, series: false });
    expect(exact.contactTimeUncertaintyMs).toBe(0);
  });
});

describe("blade speed with the puck-strike frame uncertain", () => {
  // Issue 16: marking puck strike one frame late moved blade speed 2–15 % with u unchanged.
  for (const fps of [240, 1000]) {
    it(`${fps} fps, blade accelerating 200 m/s² into the puck: the interval still holds the truth with strike marked a frame early or late`, () => {
      const { doc, truth } = syntheticShot({ captureFps: fps, frames: fps === 240 ? 150 : 400, noisePx: 0, bladeAccelMps2: 200, seed: "late" });
      for (const shift of [-1, 1]) {
        const events = { ...doc.events, puckStrike: doc.events.puckStrike + shift };
        const r = computeShot({ ...doc, events, pixelErrorPx: 0.5 }, { trials: 400, series: false });
        const [lo, hi] = r.bladeSpeedAtStrike!.interval95Mps!;
        expect({ shift, lo: lo <= truth.bladeSpeedAtStrikeMps, hi: hi >= truth.bladeSpeedAtStrikeMps }).toEqual({ shift, lo: true, hi: true });
      }
    });
  }

  it("the strike frame's ± widens blade speed only as far as the blade's motion around strike demands", () => {
    const { doc } = syntheticShot({ captureFps: 1000, frames: 400, noisePx: 0.5, seed: "widen" });
    const u = (e: number, accel: number) => {
      const s = syntheticShot({ captureFps: 1000, frames: 400, noisePx: 0.5, seed: "widen", bladeAccelMps2: accel }).doc;
      return computeShot({ ...s, eventErrorFrames: e }, { trials: 400, series: false }).bladeSpeedAtStrike!.uncertaintyMps!;
    };
    expect(doc.eventErrorFrames ?? 1).toBe(1);
    // An accelerating blade gains a·h/√3 ≈ 0.12 m/s (200 m/s², 1 ms) or more from the strike frame alone.
    expect(u(1, 200) ** 2 - u(0, 200) ** 2).toBeGreaterThan(0.12 ** 2);
    expect(u(1, 0)).toBeGreaterThanOrEqual(u(0, 0));
  });
});
