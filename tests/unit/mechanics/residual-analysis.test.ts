// Cutoff by residual analysis (Winter, Biomechanics and Motor Control of Human Movement, 4th ed.
// [P, secondary]) with the noise level read through the filter's exact noise-residual share
// (E‖(I − S)e‖² = σ²·tr((I − S)ᵀ(I − S)); Buja, Hastie & Tibshirani, Ann Stat 17:453, 1989 [P]) and the
// cutoff where the signal meets the noise floor over an octave. [calc] signals and noise are known
// by construction; the trace is checked against the filter's own columns.
import { describe, expect, it } from "vitest";
import { endPadLength, filtfilt, normalSource, residualAnalysisCutoff, syntheticShot, zeroLagDesign, zeroLagLowPass } from "../../../shared/mechanics/index";
import { noiseResidual } from "../../../shared/mechanics/residual-analysis";

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
      // The noise level read off the noise-only cutoffs, within 10 % (Winter's straight line: 25 %).
      expect(Math.abs(c.noiseRms / sigma - 1)).toBeLessThan(0.1);
      expect(rms(zeroLagLowPass(noisy, c.cutoffHz, fs), truth)).toBeLessThan(0.5 * sigma);
    });
  }

  it("the noise-residual share equals the trace from the filter's own columns (short and long pieces)", () => {
    for (const [fc, fs] of [
      [300, 1000],
      [50, 1000],
      [20, 1000],
    ]) {
      const q = zeroLagDesign(fc, fs);
      const nr = noiseResidual(q);
      for (const n of [nr.minLength, 2 * nr.minLength + 7]) {
        let trace = 0;
        for (let i = 0; i < n; i++) {
          const e = new Float64Array(n);
          e[i] = 1;
          const y = filtfilt(q, e, endPadLength(q));
          for (let k = 0; k < n; k++) trace += ((k === i ? 1 : 0) - y[k]) ** 2;
        }
        expect(Math.abs(n * nr.interior + 2 * nr.endCorrection - trace)).toBeLessThan(1e-6 * trace);
      }
    }
  });

  it("at 3,200 fps the cutoff stays put between noise draws of the same shot (within ±15 %)", () => {
    // Issue 16: the old reading of the noise level moved the cutoff up to 4× between draws.
    const cutoffs: number[] = [];
    for (let k = 0; k < 8; k++) {
      const { doc } = syntheticShot({ captureFps: 3200, frames: 400, noisePx: 0.5, seed: `stable-${k}` });
      const bottom = doc.tracks.bottomHand!;
      const series = [1, 2].map((c) => ({ fsHz: 3200, values: Float64Array.from(bottom, (m) => m[c] * 1.905) }));
      cutoffs.push(residualAnalysisCutoff(series)!.cutoffHz);
    }
    const mid = [...cutoffs].sort((a, b) => a - b)[4];
    for (const c of cutoffs) expect(Math.abs(c / mid - 1)).toBeLessThan(0.15);
  });

  it("too few samples: no choice (the track stays unsmoothed)", () => {
    expect(residualAnalysisCutoff([{ fsHz: 1000, values: Float64Array.from([1, 2, 3, 4, 5]) }])).toBeNull();
  });
});
