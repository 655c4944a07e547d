// Bad beam input is refused with a message that names the fault; the station layout is what the
// diagrams rely on. Expected values here follow from statics alone ([CP] equilibrium).
import { describe, expect, it } from "vitest";
import { StickLabInputError, beamInputProblem, solveBeam, type BeamInput } from "../../../shared/mechanics/sticklab";

const good: BeamInput = { lengthMm: 1500, supportsMm: [200, 1400], loads: [{ xMm: 600, forceN: 300 }], eiNm2: 310 };
const solveFails = (input: unknown, pattern: RegExp) => {
  expect(() => solveBeam(input as BeamInput)).toThrow(StickLabInputError);
  expect(() => solveBeam(input as BeamInput)).toThrow(pattern);
};

describe("beam input checks", () => {
  it.each([
    ["a load beyond the stick's end", { ...good, loads: [{ xMm: 1600, forceN: 10 }] }, /load 1 at 1600 mm is outside the stick \(0 to 1500 mm\)/],
    ["a load before its start", { ...good, loads: [{ xMm: 100, forceN: 5 }, { xMm: -1, forceN: 10 }] }, /load 2 at -1 mm is outside the stick/],
    ["supports in the wrong order", { ...good, supportsMm: [1400, 200] }, /supports must be in order along the stick, x1 < x2 \(got 1400 and 200\)/],
    ["supports at the same place", { ...good, supportsMm: [700, 700] }, /the two supports are at the same place \(700 mm\)/],
    ["a support off the stick", { ...good, supportsMm: [200, 1501] }, /the support at 1501 mm is off the stick/],
    ["EI zero", { ...good, eiNm2: 0 }, /eiNm2 must be a number greater than zero \(got 0\)/],
    ["EI negative", { ...good, eiNm2: -3 }, /eiNm2 must be a number greater than zero/],
    ["EI NaN", { ...good, eiNm2: NaN }, /eiNm2 must be a number greater than zero \(got NaN\)/],
    ["length NaN", { ...good, lengthMm: NaN }, /lengthMm must be a number greater than zero \(got NaN\)/],
    ["length zero", { ...good, lengthMm: 0 }, /lengthMm must be a number greater than zero/],
    ["a NaN force", { ...good, loads: [{ xMm: 600, forceN: NaN }] }, /load 1: forceN must be a number \(got NaN\)/],
    ["an infinite position", { ...good, loads: [{ xMm: Infinity, forceN: 3 }] }, /load 1: xMm must be a number/],
    ["no loads", { ...good, loads: [] }, /loads must list at least one/],
    ["one support", { ...good, supportsMm: [200] }, /supportsMm must be two positions/],
  ])("refuses %s", (_name, input, pattern) => {
    expect(beamInputProblem(input as BeamInput)).toMatch(pattern);
    solveFails(input, pattern);
  });

  it("refuses a station step that is zero or would give too many stations", () => {
    expect(() => solveBeam(good, { stepMm: 0 })).toThrow(/step must be greater than zero/);
    expect(() => solveBeam(good, { stepMm: 0.01 })).toThrow(/more than 20000 stations/);
  });

  it("accepts loads and supports at the very ends", () => {
    expect(beamInputProblem({ lengthMm: 1000, supportsMm: [0, 1000], loads: [{ xMm: 0, forceN: 1 }, { xMm: 1000, forceN: 1 }] })).toBeNull();
  });
});

describe("stations", () => {
  const r = solveBeam(good, { stepMm: 100 });

  it("run from 0 to the length in order, every step plus each load and support point", () => {
    const xs = r.stations.map((s) => s.xMm);
    expect(xs[0]).toBe(0);
    expect(xs.at(-1)).toBe(1500);
    for (let i = 1; i < xs.length; i++) expect(xs[i]).toBeGreaterThanOrEqual(xs[i - 1]);
    for (let x = 0; x <= 1500; x += 100) expect(xs).toContain(x);
  });

  it("carry the shear jump at each force point as a left and a right value", () => {
    const at = (x: number) => r.stations.filter((s) => s.xMm === x).map((s) => s.shearN);
    expect(at(200)).toEqual([0, 200]);
    expect(at(600)).toEqual([200, -100]);
    expect(at(1400)[0]).toBeCloseTo(-100, 9);
    expect(at(1400)[1]).toBe(0);
  });

  it("have zero moment and shear on the unloaded overhangs, and zero deflection at the supports", () => {
    for (const s of r.stations.filter((s) => s.xMm < 200 || s.xMm > 1400)) {
      expect(s.momentNm).toBe(0);
      expect(s.shearN).toBe(0);
    }
    for (const s of r.stations.filter((s) => s.xMm === 200 || s.xMm === 1400)) expect(Math.abs(s.deflectionMm!)).toBeLessThan(1e-12);
  });

  it("leave the deflection out without EI", () => {
    const { eiNm2: _ei, ...noEi } = good;
    const plain = solveBeam(noEi);
    expect(plain.maxDeflectionMm).toBeUndefined();
    expect(plain.stations.every((s) => s.deflectionMm === undefined)).toBe(true);
    expect(plain.maxMoment).toEqual(solveBeam(good).maxMoment);
  });

  it("put the predicted break point at the largest |M| when it is a hogging moment", () => {
    // Load on a long overhang: the largest |M| sits over the inner support and is negative.
    const o = solveBeam({ lengthMm: 1500, supportsMm: [0, 600], loads: [{ xMm: 400, forceN: 100 }, { xMm: 1500, forceN: 100 }] });
    expect(o.maxMoment.xMm).toBe(600);
    expect(o.maxMoment.valueNm).toBeCloseTo(-90, 9);
  });
});
