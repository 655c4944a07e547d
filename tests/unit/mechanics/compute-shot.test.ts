// computeShot on a made-up slap shot whose answers are known by construction (syntheticShot:
// [calc] closed-form blade, puck and bottom-hand paths). Plausibility limits: REFERENCES.md.
import { describe, expect, it } from "vitest";
import { computeShot, ENGINE_VERSION, ShotResults, syntheticShot } from "../../../shared/mechanics/index";
import { eiFromFlex } from "../../../shared/mechanics/bench-fit-normalise";
import { seriesPoints } from "../../../shared/mechanics/series-columns";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("exact marks", () => {
  const { doc, truth } = syntheticShot({ frames: 400 });
  const r = computeShot({ ...doc, cutoffHz: "raw" }, { trials: 50 });

  it("gives back the known speeds, bend, times and energy", () => {
    expect(ShotResults.safeParse(r).success).toBe(true);
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    expect(rel(r.puckExitSpeed.valueMps, truth.exitSpeedMps)).toBeLessThan(1e-9);
    expect(rel(r.bladeSpeedAtStrike!.valueMps, truth.bladeSpeedAtStrikeMps)).toBeLessThan(1e-3);
    expect(r.bladeSpeedAtStrike!.point).toBe("midpoint");
    // Read on the approach up to one frame before the marked strike (events good to ±1 frame) and
    // carried on to the strike along the blade's own motion; with exact events, at the strike itself.
    expect(r.bladeSpeedAtStrike!.frame).toBe(doc.events.puckStrike - 1);
    expect(computeShot({ ...doc, cutoffHz: "raw", eventErrorFrames: 0 }, { trials: 50 }).bladeSpeedAtStrike!.frame).toBe(doc.events.puckStrike);
    expect(r.peakBend!.frame).toBe(truth.peakBendFrame);
    expect(r.peakBend!.angleDeg).toBeCloseTo(truth.peakBendDeg, 6);
    expect(r.shaftDeflection!.valueMm).toBeCloseTo(truth.peakDeflectionMm, 6);
    expect(r.shaftDeflection!.aMm).toBeCloseTo(truth.aMm, 6);
    expect(r.shaftDeflection!.bMm).toBeCloseTo(truth.bMm, 6);
    // 3,200 fps: 25 ms of loading and 30 ms of contact are 80 and 96 frames.
    expect(r.loadTimeMs).toBe(25);
    expect(r.contactTimeMs).toBe(30);
    expect(r.frameTimeMs).toBe(0.3125);
    const ei = eiFromFlex(85, 1000);
    const [a, b, d] = [truth.aMm / 1000, truth.bMm / 1000, truth.peakDeflectionMm / 1000];
    const k = (3 * ei * (a + b)) / (a * a * b * b);
    expect(r.storedEnergy!.valueJ).toBeCloseTo(0.5 * k * d * d, 6);
    // Raw differences at 3,200 fps: the only note is about the blade speed's large uncertainty.
    expect(r.notes.map((n) => n.code)).toEqual(["BLADE_SPEED_UNCERTAIN"]);
  });

  it("time series in SI with times from puck strike, to 6 significant digits", () => {
    const strike = doc.events.puckStrike;
    const fps = doc.captureFps;
    const blade = seriesPoints(r.series.bladeSpeed);
    expect(r.series.bladeSpeed.unit).toBe("m/s");
    expect(blade).toHaveLength(doc.tracks.bladeHeel!.length + 1); // the strike frame ends one piece and starts the next
    const atStrike = blade.filter((p) => p.frame === strike);
    expect(atStrike.map((p) => p.segment)).toEqual(["beforeStrike", "afterStrike"]);
    expect(atStrike[0].value).toBeCloseTo(truth.bladeSpeedAtStrikeMps, 2);
    expect(atStrike[1].value).toBeCloseTo(0.8 * truth.bladeSpeedAtStrikeMps, 2); // the made-up impact loss
    expect(atStrike[0].tFromStrikeMs).toBe(0);
    expect(blade[0].frame).toBe(r.series.firstFrame);
    expect(blade[10].tFromStrikeMs).toBeCloseTo(((blade[10].frame - strike) * 1000) / fps, 5);
    const flight = seriesPoints(r.series.puckSpeed).filter((p) => p.segment === "afterRelease");
    for (const p of flight) expect(rel(p.value, truth.exitSpeedMps)).toBeLessThan(1e-5);
    const peak = seriesPoints(r.series.bendAngle).reduce((m, p) => (p.value > m.value ? p : m));
    expect(peak.frame).toBe(truth.peakBendFrame);
  });

  it("marking every second frame gives the same answers", () => {
    const everyOther = Object.fromEntries(Object.entries(doc.tracks).map(([k, t]) => [k, t!.filter((m) => m[0] % 2 === 0)]));
    const r2 = computeShot({ ...doc, tracks: everyOther as typeof doc.tracks, cutoffHz: "raw" }, { trials: 50 });
    expect(rel(r2.puckExitSpeed.valueMps, truth.exitSpeedMps)).toBeLessThan(1e-9);
    expect(rel(r2.bladeSpeedAtStrike!.valueMps, truth.bladeSpeedAtStrikeMps)).toBeLessThan(3e-3);
    expect(r2.peakBend!.angleDeg).toBeCloseTo(truth.peakBendDeg, 4);
  });
});

describe("noisy marks (0.5 px), cutoff by residual analysis", () => {
  it("each result lies within a few standard uncertainties of the truth", () => {
    const { doc, truth } = syntheticShot({ frames: 400, noisePx: 0.5, seed: "noisy-a" });
    const r = computeShot(doc);
    expect(r.smoothing.mode).toBe("residualAnalysis");
    for (const c of Object.values(r.smoothing.cutoffHz)) expect(c).toBeGreaterThan(10);
    const z = (v: number, u: number | null, t: number) => Math.abs(v - t) / u!;
    expect(z(r.puckExitSpeed.valueMps, r.puckExitSpeed.uncertaintyMps, truth.exitSpeedMps)).toBeLessThan(4);
    expect(z(r.bladeSpeedAtStrike!.valueMps, r.bladeSpeedAtStrike!.uncertaintyMps, truth.bladeSpeedAtStrikeMps)).toBeLessThan(4);
    expect(z(r.peakBend!.angleDeg, r.peakBend!.uncertaintyDeg, truth.peakBendDeg)).toBeLessThan(4);
    expect(z(r.shaftDeflection!.valueMm, r.shaftDeflection!.uncertaintyMm, truth.peakDeflectionMm)).toBeLessThan(4);
  });

  it("the stated blade-speed and bend uncertainties match the scatter over 60 noisy copies", { timeout: 30_000 }, () => {
    const blade: number[] = [];
    const bend: number[] = [];
    const uBlade: number[] = [];
    const uBend: number[] = [];
    let truth = syntheticShot().truth;
    for (let i = 0; i < 60; i++) {
      const s = syntheticShot({ frames: 300, noisePx: 0.5, seed: `scatter-${i}` });
      truth = s.truth;
      // A fixed cutoff, so only the digitising noise varies between copies.
      const r = computeShot({ ...s.doc, cutoffHz: 60 }, { trials: 200, series: false });
      blade.push(r.bladeSpeedAtStrike!.valueMps);
      bend.push(r.peakBend!.angleDeg);
      uBlade.push(r.bladeSpeedAtStrike!.uncertaintyMps!);
      uBend.push(r.peakBend!.uncertaintyDeg!);
    }
    const mean = (x: number[]) => x.reduce((a, b) => a + b, 0) / x.length;
    const sd = (x: number[]) => Math.sqrt(x.reduce((a, v) => a + (v - mean(x)) ** 2, 0) / (x.length - 1));
    // 60 copies estimate a standard deviation to about ±9 %: allow 25 %.
    expect(Math.abs(mean(uBlade) / sd(blade) - 1)).toBeLessThan(0.25);
    expect(Math.abs(mean(uBend) / sd(bend) - 1)).toBeLessThan(0.25);
    // Smoothing bias stays small next to the uncertainty.
    expect(Math.abs(mean(blade) - truth.bladeSpeedAtStrikeMps)).toBeLessThan(mean(uBlade));
    expect(Math.abs(mean(bend) - truth.peakBendDeg)).toBeLessThan(mean(uBend));
  });

  it("the same document and seed give the same results; another seed, the same values", () => {
    const { doc } = syntheticShot({ frames: 300, noisePx: 0.5, seed: "repeat" });
    const a = computeShot(doc, { trials: 100 });
    expect(JSON.stringify(computeShot(doc, { trials: 100 }))).toBe(JSON.stringify(a));
    const b = computeShot(doc, { trials: 100, seed: "other" });
    expect(b.puckExitSpeed.valueMps).toBe(a.puckExitSpeed.valueMps);
    expect(b.puckExitSpeed.uncertaintyMps).not.toBe(a.puckExitSpeed.uncertaintyMps);
  });
});

describe("missing parts and plausibility notes", () => {
  const { doc } = syntheticShot({ frames: 300 });
  const codes = (r: ShotResults) => r.notes.map((n) => n.code);

  it("puck only: speeds and times, no blade, bend or energy", () => {
    const r = computeShot({ ...doc, tracks: { puck: doc.tracks.puck }, stick: null }, { trials: 20 });
    expect(r.bladeSpeedAtStrike).toBeNull();
    expect(r.peakBend).toBeNull();
    expect(r.storedEnergy).toBeNull();
    expect(r.series.bendAngle.frame).toEqual([]);
  });

  it("no stick: no stored energy; blade heel only: the heel is the blade point", () => {
    const r = computeShot({ ...doc, stick: null, tracks: { ...doc.tracks, bladeToe: undefined } }, { trials: 20 });
    expect(r.storedEnergy).toBeNull();
    expect(r.bladeSpeedAtStrike!.point).toBe("heel");
    expect(r.peakBend).not.toBeNull();
  });

  it("[P/CP] puck faster than 52 m/s and contact outside 5–60 ms are flagged", () => {
    const fast = syntheticShot({ frames: 300, exitSpeedMps: 60 }).doc;
    expect(codes(computeShot(fast, { trials: 20 }))).toContain("PUCK_SPEED_IMPLAUSIBLE");
    const long = { ...doc, events: { ...doc.events, puckStrike: doc.events.release - 200, iceStrike: undefined, peakBend: undefined } };
    expect(codes(computeShot(long, { trials: 20 }))).toContain("CONTACT_TIME_OUTSIDE_RANGE");
  });

  it("a flight mark 15 px off the puck's straight path is flagged", () => {
    const noisy = syntheticShot({ frames: 300, noisePx: 0.5, seed: "mis-mark" }).doc;
    expect(codes(computeShot(noisy, { trials: 20 }))).not.toContain("PUCK_FLIGHT_NOT_STRAIGHT");
    const rel = noisy.events.release;
    const puck = noisy.tracks.puck.map((m): typeof m => (m[0] === rel + 4 ? [m[0], m[1], m[2] + 15] : m));
    expect(codes(computeShot({ ...noisy, tracks: { ...noisy.tracks, puck } }, { trials: 20 }))).toContain("PUCK_FLIGHT_NOT_STRAIGHT");
  });

  it("the blade not marked up to puck strike: no blade speed, with a note", () => {
    const strike = doc.events.puckStrike;
    const cut = (t: typeof doc.tracks.puck) => t.filter((m) => m[0] < strike - 5 || m[0] > strike);
    const r = computeShot({ ...doc, tracks: { ...doc.tracks, bladeHeel: cut(doc.tracks.bladeHeel!), bladeToe: cut(doc.tracks.bladeToe!) } }, { trials: 20 });
    expect(r.bladeSpeedAtStrike).toBeNull();
    expect(codes(r)).toContain("BLADE_NOT_AT_STRIKE");
  });
});
