// The engine filters a track's x and y side by side (butterworth.ts, filtfiltPair and friends; the
// adjoint of a state's two weight rows in linear-response.ts): two recurrences interleaved, for
// speed only. Checked here to give the very bits of filtering each one on its own [calc, no outside
// source]; filtfilt itself is checked against scipy in filter-scipy.test.ts.
import { describe, expect, it } from "vitest";
import { filtfiltAdjoint, filtfiltAdjointPair } from "../../../shared/mechanics/linear-response";
import { endPadLength, filtfilt, filtfiltPair, filtfiltResidualSS, filtfiltResidualSSPair, normalSource, zeroLagDesign, zeroLagLowPass, zeroLagLowPassPair } from "../../../shared/mechanics/index";

const normal = normalSource("filter-pair");
const signal = (n: number, k: number) => Float64Array.from({ length: n }, (_, i) => 100 * Math.sin(i / (7 + k)) + 20 * k + normal());
const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

describe("filtering a pair of coordinates side by side", () => {
  it("gives each coordinate's own filtfilt to the bit, short and long, at low and high cutoffs", () => {
    for (const [fc, fs] of [[5, 3200], [60, 1000], [100, 240], [400, 1000]])
      for (const n of [0, 1, 2, 3, 5, 40, 2500]) {
        const x = signal(n, 1);
        const y = signal(n, 2);
        const q = zeroLagDesign(fc, fs);
        for (const pad of [9, endPadLength(q)]) {
          const [px, py] = filtfiltPair(q, x, y, pad);
          expect(same(px, filtfilt(q, x, pad)) && same(py, filtfilt(q, y, pad)), `${fc} Hz at ${fs} Hz, n ${n}, pad ${pad}`).toBe(true);
          const [sx, sy] = filtfiltResidualSSPair(q, x, y, pad, 2);
          expect([sx, sy]).toEqual([filtfiltResidualSS(q, x, pad, 2), filtfiltResidualSS(q, y, pad, 2)]);
        }
        const [lx, ly] = zeroLagLowPassPair(x, y, fc, fs);
        expect(same(lx, zeroLagLowPass(x, fc, fs)) && same(ly, zeroLagLowPass(y, fc, fs))).toBe(true);
      }
  });

  it("the smoothing's adjoint (the Monte Carlo's weights) of a pair gives each vector's own to the bit", () => {
    for (const [fc, fs] of [[5, 3200], [60, 1000], [400, 1000]])
      for (const n of [1, 2, 3, 40, 700]) {
        const q = zeroLagDesign(fc, fs);
        const v = signal(n, 3);
        const w = signal(n, 4);
        const [a, b] = filtfiltAdjointPair(q, v, w, endPadLength(q));
        expect(same(a, filtfiltAdjoint(q, v, endPadLength(q))) && same(b!, filtfiltAdjoint(q, w, endPadLength(q))), `${fc} Hz at ${fs} Hz, n ${n}`).toBe(true);
      }
  });

  it("refuses two signals of different lengths", () => {
    const q = zeroLagDesign(60, 1000);
    expect(() => filtfiltPair(q, signal(10, 1), signal(11, 2))).toThrow(/one length/);
    expect(() => filtfiltResidualSSPair(q, signal(10, 1), signal(9, 2))).toThrow(/one length/);
    expect(() => filtfiltAdjointPair(q, signal(10, 1), signal(9, 2), 9)).toThrow(/one length/);
  });
});
