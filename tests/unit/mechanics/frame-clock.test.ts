// Issue 15: speeds and times come from each frame's capture time, not frame index ÷ rate. A clip
// at 240 fps that lost frames (a damaged stretch) is made here with known motion; the numbers
// must hold to 0.5 % of the truth with the frame clock, and the notes must say where the gap is.
// Non-uniform differencing is checked against numpy.gradient (Debian's python3-numpy).
import { execFileSync, spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { computeShot, gradientMps, isMechanicsInputError, type ShotDocumentInput } from "../../../shared/mechanics/index";
import { seriesPoints } from "../../../shared/mechanics/series-columns";

const FPS = 240;
const MM_PER_PX = 2;
const EXIT_MPS = 30;
const BLADE_MPS = 20;

/** Slot (capture instant, in 1/240 s) of each frame 1..n: frames after `after` skip `missing` slots. */
function slots(n: number, gaps: { after: number; missing: number }[]): number[] {
  const out: number[] = [];
  let s = 0;
  for (let f = 1; f <= n; f++) {
    out.push(s);
    const g = gaps.find((x) => x.after === f);
    s += 1 + (g?.missing ?? 0);
  }
  return out;
}

/**
 * Blade moving at 20 m/s until puck strike (frame 100), puck resting until release (frame 110)
 * then flying at 30 m/s. Marks in pixels (x right, 2 mm a pixel); positions follow the real
 * capture instants, so frames after the gap are further along than index ÷ rate says.
 */
function shot(gaps: { after: number; missing: number }[], withClock: boolean): ShotDocumentInput {
  const n = 160;
  const slot = slots(n, gaps);
  const t = (f: number) => slot[f - 1] / FPS;
  const strike = 100;
  const release = 110;
  const puck: [number, number, number][] = [];
  const heel: [number, number, number][] = [];
  for (let f = 1; f <= n; f++) {
    const puckX = f < release ? 0 : EXIT_MPS * 1000 * (t(f) - t(release));
    if (f >= release - 5) puck.push([f, 600 + puckX / MM_PER_PX, 300]);
    if (f <= strike) heel.push([f, 600 - (BLADE_MPS * 1000 * (t(strike) - t(f))) / MM_PER_PX, 320]);
  }
  return {
    captureFps: FPS,
    calibration: { type: "scaleBar", a: [0, 0], b: [76.2 / MM_PER_PX, 0], lengthMm: 76.2 },
    pixelErrorPx: 0.2,
    cutoffHz: "raw",
    frameRange: [1, n],
    tracks: { puck, bladeHeel: heel },
    events: { iceStrike: 90, puckStrike: strike, release },
    ...(withClock ? { frameTimes: { firstFrame: 1, seconds: slot.map((s) => s / FPS) } } : {}),
  };
}

describe("the frame clock in the engine", () => {
  // Three frames lost right after release, inside the puck's flight window; one before strike.
  const gaps = [
    { after: 112, missing: 3 },
    { after: 95, missing: 2 },
  ];

  it("puck exit speed on an uneven clip is within 0.5 % of the truth, with a 95 % interval that covers it", () => {
    const r = computeShot(shot(gaps, true), { trials: 200 });
    expect(Math.abs(r.puckExitSpeed.valueMps - EXIT_MPS) / EXIT_MPS).toBeLessThan(0.005);
    const [lo, hi] = r.puckExitSpeed.interval95Mps!;
    expect(lo).toBeLessThanOrEqual(EXIT_MPS);
    expect(hi).toBeGreaterThanOrEqual(EXIT_MPS);
  });

  it("frame index ÷ rate on the same marks is wrong (what the clock fixes)", () => {
    const r = computeShot(shot(gaps, false), { trials: 50 });
    expect(Math.abs(r.puckExitSpeed.valueMps - EXIT_MPS) / EXIT_MPS).toBeGreaterThan(0.05);
  });

  it("blade speed at strike, load and contact time follow the clock", () => {
    const r = computeShot(shot(gaps, true), { trials: 50 });
    expect(Math.abs(r.bladeSpeedAtStrike!.valueMps - BLADE_MPS) / BLADE_MPS).toBeLessThan(0.005);
    // Ice strike (frame 90) → puck strike (100) spans the two missing frames after 95: 12 slots.
    expect(r.loadTimeMs).toBeCloseTo((12 * 1000) / FPS, 9);
    expect(r.contactTimeMs).toBeCloseTo((10 * 1000) / FPS, 9);
    const strikeSeries = seriesPoints(r.series.bladeSpeed).find((p) => p.frame === 96)!;
    expect(strikeSeries.tFromStrikeMs).toBeCloseTo((-4 * 1000) / FPS, 5); // series times are kept to the ns
  });

  it("results whose frames span a gap say so, naming the frames", () => {
    const r = computeShot(shot(gaps, true), { trials: 50 });
    const gapNotes = r.notes.filter((n) => n.code === "TIMING_GAP").map((n) => n.message);
    expect(gapNotes.some((m) => m.startsWith("puck exit speed") && m.includes("between frames 112 and 113") && m.includes("3 frames missing"))).toBe(true);
    expect(gapNotes.some((m) => m.startsWith("load time") && m.includes("between frames 95 and 96"))).toBe(true);
    expect(gapNotes.some((m) => m.startsWith("contact time"))).toBe(false);
  });

  it("an even clock gives the same results as frame ÷ rate", () => {
    const a = computeShot(shot([], true), { trials: 50 });
    const b = computeShot(shot([], false), { trials: 50 });
    expect(a.puckExitSpeed.valueMps).toBeCloseTo(b.puckExitSpeed.valueMps, 9);
    expect(a.bladeSpeedAtStrike!.valueMps).toBeCloseTo(b.bladeSpeedAtStrike!.valueMps, 9);
    expect(a.notes.filter((n) => n.code === "TIMING_GAP")).toEqual([]);
  });

  it("refuses times that do not cover the marks, or that run backwards", () => {
    const doc = shot([], true);
    const short = { ...doc, frameTimes: { firstFrame: 1, seconds: doc.frameTimes!.seconds.slice(0, 100) } };
    expect(() => computeShot(short, { trials: 20 })).toThrow(/cover frames 1–100/);
    const back = { ...doc, frameTimes: { firstFrame: 1, seconds: doc.frameTimes!.seconds.map((s, i) => (i === 50 ? 0 : s)) } };
    try {
      computeShot(back, { trials: 20 });
      expect.unreachable();
    } catch (e) {
      expect(isMechanicsInputError(e) && e.message).toMatch(/frame 51 comes before frame 50/);
    }
  });
});

const PYTHON = "/usr/bin/python3";
const hasNumpy = spawnSync(PYTHON, ["-c", "import numpy"]).status === 0;

describe.skipIf(!hasNumpy)("differencing on uneven times", () => {
  it("matches numpy.gradient(v, t, edge_order=2) [general-purpose reference library]", () => {
    const t = [0, 0.004, 0.009, 0.0125, 0.03, 0.034, 0.0381, 0.05];
    const v = t.map((s) => 1000 * (3 * s + 40 * s * s - 200 * s ** 3));
    const out = execFileSync(PYTHON, ["-c", "import sys,json,numpy as np; d=json.load(sys.stdin); print(json.dumps(np.gradient(np.array(d['v']), np.array(d['t']), edge_order=2).tolist()))"], {
      input: JSON.stringify({ v, t }),
    });
    const ref: number[] = JSON.parse(out.toString());
    const ours = gradientMps(Float64Array.from(v), t);
    ref.forEach((r, i) => expect(ours[i]).toBeCloseTo(r / 1000, 10));
  });
});
