// The beam solver against closed-form handbook cases.
// Source for cases 7 and 8: AISC "Beam Diagrams and Formulas" (also Machinery's Handbook) [P],
// as collected in ../shared/design/REFERENCES.md (Beams).
import { describe, expect, it } from "vitest";
import { solveBeam, beamAt, type BeamResult } from "../../../shared/mechanics/sticklab";
import { relErr } from "./support";

const TOL = 1e-9;
const near = (got: number | undefined, want: number) => {
  expect(got).toBeDefined();
  expect(relErr(got!, want)).toBeLessThan(TOL);
};
const deflectionAt = (r: BeamResult, xMm: number) => r.stations.find((s) => s.xMm === xMm)!.deflectionMm!;

// SI for the formulas: F in N, lengths in m, EI in N·m² → deflection in m.
const F = 400;
const EI = 310;
const Lm = 1.5;

describe("AISC case 7: simple beam, concentrated load at centre", () => {
  const r = solveBeam({ lengthMm: 1500, supportsMm: [0, 1500], loads: [{ xMm: 750, forceN: F }], eiNm2: EI });

  it("reactions and shear are F/2", () => {
    near(r.reactionsN[0], F / 2);
    near(r.reactionsN[1], F / 2);
    near(Math.abs(r.maxShearN), F / 2);
  });

  it("M_max = FL/4 at mid-span", () => {
    near(r.maxMoment.valueNm, (F * Lm) / 4);
    expect(r.maxMoment.xMm).toBe(750);
  });

  it("deflection under the load and its maximum = FL³/(48EI)", () => {
    const want = ((F * Lm ** 3) / (48 * EI)) * 1000;
    near(deflectionAt(r, 750), want);
    near(r.maxDeflectionMm, want);
    expect(relErr(r.maxDeflectionXMm!, 750)).toBeLessThan(1e-6);
  });

  it("the deflected shape follows Δx = Fx(3L² − 4x²)/(48EI) for x < L/2 ([M] from memory, AISC case 7)", () => {
    for (const xMm of [100, 250, 500, 700]) {
      const x = xMm / 1000;
      near(deflectionAt(r, xMm), ((F * x * (3 * Lm ** 2 - 4 * x ** 2)) / (48 * EI)) * 1000);
    }
  });
});

describe.each([
  { name: "a > b", aMm: 1100 },
  { name: "a < b", aMm: 400 },
])("AISC case 8: simple beam, concentrated load at any point ($name)", ({ aMm }) => {
  const a = aMm / 1000;
  const b = Lm - a;
  const r = solveBeam({ lengthMm: 1500, supportsMm: [0, 1500], loads: [{ xMm: aMm, forceN: F }], eiNm2: EI });

  it("reactions Fb/L and Fa/L; shear +Fb/L left of the load and −Fa/L right of it", () => {
    near(r.reactionsN[0], (F * b) / Lm);
    near(r.reactionsN[1], (F * a) / Lm);
    const under = r.stations.filter((s) => s.xMm === aMm);
    expect(under).toHaveLength(2);
    near(under[0].shearN, (F * b) / Lm);
    near(under[1].shearN, (-F * a) / Lm);
    near(Math.abs(r.maxShearN), (F * Math.max(a, b)) / Lm);
  });

  it("M_max = Fab/L under the load", () => {
    near(r.maxMoment.valueNm, (F * a * b) / Lm);
    expect(r.maxMoment.xMm).toBe(aMm);
  });

  it("deflection under the load = Fa²b²/(3EIL)", () => {
    near(deflectionAt(r, aMm), ((F * a * a * b * b) / (3 * EI * Lm)) * 1000);
  });

  it("δ_max = Fab(a+2b)√(3a(a+2b))/(27EIL) at x = √(a(a+2b)/3), on the longer side", () => {
    // The handbook states it for a > b from the left support; for a < b, mirror the beam.
    const [p, q] = a > b ? [a, b] : [b, a];
    near(r.maxDeflectionMm, ((F * p * q * (p + 2 * q) * Math.sqrt(3 * p * (p + 2 * q))) / (27 * EI * Lm)) * 1000);
    const xFromLongEnd = Math.sqrt((p * (p + 2 * q)) / 3) * 1000;
    near(r.maxDeflectionXMm, a > b ? xFromLongEnd : 1500 - xFromLongEnd);
  });

  it("moment left of the load is Fbx/L (AISC case 8, Mx for x < a)", () => {
    for (const xMm of [50, aMm / 2, aMm - 5]) near(beamAt({ lengthMm: 1500, supportsMm: [0, 1500], loads: [{ xMm: aMm, forceN: F }] }, xMm).momentNm, (F * b * xMm) / 1000 / Lm);
  });
});

describe("worked example (pickedshares.com, in REFERENCES.md): F = 1000 N, L = 3000 mm, E = 210 000 N/mm², I = 1.67e6 mm⁴", () => {
  const eiNm2 = (210_000 * 1.67e6) / 1e6; // N·mm² → N·m²

  it("centre load: δ = 1.604 mm, M = 750 N·m, reactions 500 N (to the published digits)", () => {
    const r = solveBeam({ lengthMm: 3000, supportsMm: [0, 3000], loads: [{ xMm: 1500, forceN: 1000 }], eiNm2 });
    expect(r.maxDeflectionMm!).toBeCloseTo(1.604, 3);
    expect(r.maxMoment.valueNm).toBeCloseTo(750, 9);
    expect(r.reactionsN[0]).toBeCloseTo(500, 9);
    expect(r.reactionsN[1]).toBeCloseTo(500, 9);
  });

  it("off-centre calc, a = 2000 mm: reactions 333.3 / 666.7 N, M = 666.7 N·m at 2000 mm, δ 1.267 under the load, δ_max 1.380 at 1633 mm", () => {
    const r = solveBeam({ lengthMm: 3000, supportsMm: [0, 3000], loads: [{ xMm: 2000, forceN: 1000 }], eiNm2 });
    expect(r.reactionsN[0]).toBeCloseTo(333.3, 1);
    expect(r.reactionsN[1]).toBeCloseTo(666.7, 1);
    expect(r.maxMoment.valueNm).toBeCloseTo(666.7, 1);
    expect(r.maxMoment.xMm).toBe(2000);
    expect(deflectionAt(r, 2000)).toBeCloseTo(1.267, 3);
    expect(r.maxDeflectionMm!).toBeCloseTo(1.38, 3);
    expect(Math.round(r.maxDeflectionXMm!)).toBe(1633);
  });
});

describe("overhang, load at the free end ([M] from memory: AISC case 24, beam overhanging one support)", () => {
  // l between supports, overhang a: R1 = Pa/l (pulling down), R2 = P(l + a)/l, M_max = Pa at R2,
  // free-end deflection Pa²(l + a)/(3EI), upward bow between supports Pal²/(9√3 EI) at l/√3.
  const l = 1.2;
  const a = 0.3;
  const r = solveBeam({ lengthMm: 1500, supportsMm: [0, 1200], loads: [{ xMm: 1500, forceN: F }], eiNm2: EI });

  it("reactions, moment over the support and the two deflections", () => {
    near(r.reactionsN[0], (-F * a) / l);
    near(r.reactionsN[1], (F * (l + a)) / l);
    near(r.maxMoment.valueNm, -F * a);
    expect(r.maxMoment.xMm).toBe(1200);
    near(deflectionAt(r, 1500), ((F * a * a * (l + a)) / (3 * EI)) * 1000);
    const bow = Math.min(...r.stations.map((s) => s.deflectionMm!));
    near(bow, ((-F * a * l * l) / (9 * Math.sqrt(3) * EI)) * 1000);
  });
});
