// Cutoff by residual analysis (Winter, Biomechanics and Motor Control of Human Movement, 4th ed.
// [P, secondary]) on a known signal plus seeded white noise: the chosen cutoff keeps the signal and
// removes most of the noise. [calc] the signal and the noise are known by construction.
import { describe, expect, it } from "vitest";
import { normalSource, residualAnalysisCutoff, zeroLagLowPass } from "../../../shared/mechanics/index";

const rms = (a: ArrayLike<number>, b: ArrayLike<number>) => {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] - b[i]) ** 2;
  return Math.sqrt(s / a.length);
};

describe("residual analysis", () => {
  for (const [fs, fSignal] of [
    [200, 3],
    [3200, 25],
  ]) {
    it(`${fSignal} Hz motion sampled at ${fs} Hz with noise: cutoff above the motion, most noise removed`, () => {
      const normal = normalSource(`residual-${fs}`);
      const n = 600;
      const sigma = 1.5;
      const truth = Float64Array.from({ length: n }, (_, i) => 80 * Math.sin((2 * Math.PI * fSignal * i) / fs) + 30 * Math.sin((2 * Math.PI * 0.4 * fSignal * i) / fs));
      const noisy = truth.map((v) => v + sigma * normal());
      const c = residualAnalysisCutoff([{ fsHz: fs, values: noisy }])!;
      expect(c.cutoffHz).toBeGreaterThan(fSignal);
      expect(c.cutoffHz).toBeLessThan(fs / 4);
      // The intercept of the noise line estimates the noise RMS (within 25 %).
      expect(Math.abs(c.noiseRms / sigma - 1)).toBeLessThan(0.25);
      expect(rms(zeroLagLowPass(noisy, c.cutoffHz, fs), truth)).toBeLessThan(0.5 * sigma);
    });
  }

  it("too few samples: no choice (the track stays unsmoothed)", () => {
    expect(residualAnalysisCutoff([{ fsHz: 1000, values: Float64Array.from([1, 2, 3, 4, 5]) }])).toBeNull();
  });
});
