// Test 2 of issue 5: the zero-lag Butterworth against the reference implementation,
// scipy.signal.butter + filtfilt from Debian's python3-scipy, run on the same input.
// Cutoff correction: Winter, Biomechanics and Motor Control of Human Movement, 4th ed. [P, secondary].
import { execFileSync, spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import {
  biquadGain,
  butterLowPass,
  endPadLength,
  filtfilt,
  normalSource,
  twoPassDesignCutoff,
  TWO_PASS_CORRECTION,
  zeroLagDesign,
  zeroLagLowPass,
} from "../../../shared/mechanics/index";

const PYTHON = "/usr/bin/python3";
const hasScipy = spawnSync(PYTHON, ["-c", "import scipy.signal"]).status === 0;
if (!hasScipy) console.warn("skipping the scipy comparisons: /usr/bin/python3 with scipy (Debian package python3-scipy) is missing");

const SCRIPT = `
import sys, json
from scipy.signal import butter, filtfilt
d = json.load(sys.stdin)
b, a = butter(2, d["wn"])
kw = {} if d["padlen"] is None else {"padlen": d["padlen"]}
print(json.dumps({"b": b.tolist(), "a": a.tolist(), "y": filtfilt(b, a, d["x"], **kw).tolist()}))
`;

function scipy(x: number[], designHz: number, fsHz: number, padlen: number | null): { b: number[]; a: number[]; y: number[] } {
  const out = execFileSync(PYTHON, ["-c", SCRIPT], { input: JSON.stringify({ x, wn: designHz / (fsHz / 2), padlen }) });
  return JSON.parse(out.toString());
}

/** A digitised-looking coordinate: drift, a swing, and seeded noise. */
function signal(n: number, seed: string): number[] {
  const normal = normalSource(seed);
  return Array.from({ length: n }, (_, i) => 3 * i + 40 * Math.sin(i / 25) + 10 * Math.cos(i / 7) + 2 * normal());
}

const maxAbsDiff = (a: ArrayLike<number>, b: ArrayLike<number>) => {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
};
const range = (x: number[]) => Math.max(...x) - Math.min(...x);

describe("two-pass cutoff correction (Winter)", () => {
  it("C = (2^(1/2) − 1)^(1/4) = 0.802", () => {
    expect(TWO_PASS_CORRECTION).toBeCloseTo(0.802, 3);
  });
  it("[calc, REFERENCES.md] 6 Hz wanted at 200 Hz sampling → 7.467 Hz single-pass design", () => {
    expect(twoPassDesignCutoff(6, 200)).toBeCloseTo(7.467, 3);
  });
  it("the forward–backward response is −3 dB (gain 1/√2) at the wanted cutoff", () => {
    for (const [fc, fs] of [[6, 200], [60, 3200], [400, 1000]]) expect(biquadGain(zeroLagDesign(fc, fs), fc, fs) ** 2).toBeCloseTo(Math.SQRT1_2, 10);
  });
});

describe.skipIf(!hasScipy)("against scipy.signal butter + filtfilt (python3-scipy)", () => {
  const fs = 3200;
  const fc = 60;
  const design = twoPassDesignCutoff(fc, fs);
  const x = signal(500, "filter-vs-scipy");

  it("fili's 2nd-order coefficients equal scipy.signal.butter(2, Wn)", () => {
    const ref = scipy(x, design, fs, null);
    const q = butterLowPass(design, fs);
    expect(maxAbsDiff([q.b0, q.b1, q.b2], ref.b)).toBeLessThan(1e-12);
    expect(maxAbsDiff([1, q.a1, q.a2], ref.a)).toBeLessThan(1e-12);
  });

  it("scipy's default padding (odd, padlen 9): max difference < 1e-6 of the signal range", () => {
    const ref = scipy(x, design, fs, null);
    expect(maxAbsDiff(filtfilt(butterLowPass(design, fs), x), ref.y)).toBeLessThan(1e-6 * range(x));
  });

  it("the engine's longer padding equals scipy filtfilt with the same padlen", () => {
    const q = zeroLagDesign(fc, fs);
    const padlen = endPadLength(q);
    expect(padlen).toBeGreaterThan(9);
    const ref = scipy(x, design, fs, padlen);
    expect(maxAbsDiff(zeroLagLowPass(x, fc, fs), ref.y)).toBeLessThan(1e-6 * range(x));
  });

  it("a short piece (8 samples, padlen n − 1) equals scipy with padlen 7", () => {
    const short = x.slice(0, 8);
    const ref = scipy(short, design, fs, 7);
    expect(maxAbsDiff(zeroLagLowPass(short, fc, fs), ref.y)).toBeLessThan(1e-6 * range(short));
  });
});
