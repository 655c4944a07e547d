// The bench fit against the outside world: NIST's certified regression, the flex rating's
// definition, and the flex → stiffness → EI example of ../shared/design/REFERENCES.md.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { flexToNPerM, inToMm, lbfToN } from "../../../shared/units";
import {
  StickLabInputError,
  eiFromBenchStiffness,
  eiFromFlex,
  fitBench,
  fitLine,
  flexFromEi,
  type BenchReading,
} from "../../../shared/mechanics/sticklab";
import { fixture, lre, relErr } from "./support";

const lbfIn = (pairs: [number, number][]): BenchReading[] => pairs.map(([lbf, inch]) => ({ loadN: lbfToN(lbf), deflectionMm: inToMm(inch) }));

describe("NIST StRD linear regression 'Norris' [P] (certified values; copy in tests/fixtures/sticklab)", () => {
  const rows = readFileSync(fixture("nist-strd-norris.csv"), "utf8").trim().split("\n").slice(1).map((l) => l.split(",").map(Number));
  const x = rows.map((r) => r[0]);
  const y = rows.map((r) => r[1]);
  const B1 = 1.00211681802045;
  const B0 = -0.262323073774029;
  const R2 = 0.999993745883712;

  it("has the 36 observations", () => expect(rows).toHaveLength(36));

  it("fitLine gives slope, intercept and R² to at least 9 significant digits", () => {
    const f = fitLine(x, y);
    expect(lre(f.slope, B1)).toBeGreaterThanOrEqual(9);
    expect(lre(f.intercept, B0)).toBeGreaterThanOrEqual(9);
    expect(lre(f.r2, R2)).toBeGreaterThanOrEqual(9);
  });

  it("the bench fit reads the same line when x is deflection (mm) and y is load (N)", () => {
    const fit = fitBench(rows.map(([d, l]) => ({ loadN: l, deflectionMm: d })));
    expect(lre(fit.stiffnessNPerMm, B1)).toBeGreaterThanOrEqual(9);
    expect(lre(fit.interceptN, B0)).toBeGreaterThanOrEqual(9);
    expect(lre(fit.r2, R2)).toBeGreaterThanOrEqual(9);
    expect(fit.n).toBe(36);
  });
});

describe("flex rating [CP]: the load in lbf that bends the shaft one inch at mid-span", () => {
  it("a reading set reaching 85 lbf at 1.00 in fits as 85 flex, 100 % of an 85 rating", () => {
    const fit = fitBench(lbfIn([[21.25, 0.25], [42.5, 0.5], [63.75, 0.75], [85, 1.0]]), { ratedFlex: 85 });
    expect(relErr(fit.stiffnessLbfPerIn, 85)).toBeLessThan(1e-12);
    expect(relErr(fit.measuredFlex, 85)).toBeLessThan(1e-12);
    expect(relErr(fit.percentOfRated!, 100)).toBeLessThan(1e-12);
    expect(Math.abs(fit.interceptLbf)).toBeLessThan(1e-9);
    expect(fit.flags).toEqual([]);
  });

  it("a used 85 stick reading 71 lbf per inch is 83.5 % of rated (the issue's example figures, invented)", () => {
    const fit = fitBench(lbfIn([[10, 10 / 71], [20, 20 / 71], [30, 30 / 71], [40, 40 / 71]]), { ratedFlex: 85 });
    expect(fit.measuredFlex).toBeCloseTo(71, 9);
    expect(fit.percentOfRated!).toBeCloseTo((100 * 71) / 85, 9);
  });

  it("percentOfRated is null without a rating", () => {
    expect(fitBench(lbfIn([[10, 0.1], [20, 0.2], [30, 0.3]])).percentOfRated).toBeNull();
  });
});

describe("flex → stiffness → EI (REFERENCES.md calc: k = flex × 175.127 N/m, EI = kL³/48)", () => {
  it("85 flex on 1 m: k = 14.886 kN/m, EI = 310.1 N·m²; 100 flex: 17.51 kN/m, 364.8 N·m²", () => {
    expect(flexToNPerM(85) / 1000).toBeCloseTo(14.886, 3);
    expect(eiFromFlex(85)).toBeCloseTo(310.1, 1);
    expect(flexToNPerM(100) / 1000).toBeCloseTo(17.51, 2);
    expect(eiFromFlex(100)).toBeCloseTo(364.8, 1);
  });

  it("a bench fit of 85 lbf/in on a 1,000 mm span at mid-span gives EI = 310.1 N·m²", () => {
    const fit = fitBench(lbfIn([[20, 20 / 85], [40, 40 / 85], [60, 60 / 85]]));
    expect(fit.eiNm2).toBeCloseTo(310.1, 1);
    expect(relErr(flexFromEi(fit.eiNm2), 85)).toBeLessThan(1e-12);
  });
});

describe("normalising to the rating's span and centre load", () => {
  it("a 0.5 m span needs 8× the force (Cross & Lindsey 2016, force ∝ 1/L³) [P, not peer-reviewed]", () => {
    const k = 8 * 85;
    const fit = fitBench(lbfIn([[50, 50 / k], [100, 100 / k], [150, 150 / k], [200, 200 / k]]), { spanMm: 500, ratedFlex: 85 });
    expect(relErr(fit.stiffnessLbfPerIn, 680)).toBeLessThan(1e-12);
    expect(relErr(fit.measuredFlex, 85)).toBeLessThan(1e-12);
  });

  it("a configurable reference span: the same shaft shows 8× the flex on a 500 mm reference", () => {
    const readings = lbfIn([[20, 0.25], [40, 0.5], [60, 0.75]]);
    expect(relErr(fitBench(readings, { referenceSpanMm: 500 }).measuredFlex, 8 * 80)).toBeLessThan(1e-12);
  });

  it("an off-centre load point recovers EI from δ = Fa²b²/(3EIL) (AISC case 8, calc)", () => {
    const EI = 300;
    const [a, b, L] = [0.3, 0.7, 1.0];
    const kNPerMm = (3 * EI * L) / (a * a * b * b) / 1000;
    const fit = fitBench([100, 200, 300, 400].map((f) => ({ loadN: f, deflectionMm: f / kNPerMm })), { loadPointMm: 300 });
    expect(relErr(fit.eiNm2, EI)).toBeLessThan(1e-12);
    expect(relErr(fit.measuredFlex, flexFromEi(EI))).toBeLessThan(1e-12);
    expect(relErr(eiFromBenchStiffness(kNPerMm, { spanMm: 1000, loadPointMm: 700 }), EI)).toBeLessThan(1e-12);
  });

  it("refuses a load point off the span, a bad span and a bad rating", () => {
    const readings = lbfIn([[20, 0.25], [40, 0.5], [60, 0.75]]);
    expect(() => fitBench(readings, { loadPointMm: 1000 })).toThrow(/load point must lie between the supports/);
    expect(() => fitBench(readings, { loadPointMm: 0 })).toThrow(/load point must lie between the supports/);
    expect(() => fitBench(readings, { spanMm: -5 })).toThrow(/span between supports must be a number greater than zero/);
    expect(() => fitBench(readings, { ratedFlex: 0 })).toThrow(/rated flex must be a number greater than zero/);
    expect(() => fitBench(readings, { referenceSpanMm: NaN })).toThrow(StickLabInputError);
  });

  it("refuses readings where deflection falls as load rises", () => {
    expect(() => fitBench([{ loadN: 10, deflectionMm: 3 }, { loadN: 20, deflectionMm: 2 }, { loadN: 30, deflectionMm: 1 }])).toThrow(/fitted stiffness is not positive/);
  });

  it("refuses SI readings with a zero load", () => {
    expect(() => fitBench([{ loadN: 0, deflectionMm: 0 }, { loadN: 20, deflectionMm: 2 }, { loadN: 30, deflectionMm: 3 }])).toThrow(/row 1: load must be greater than zero/);
  });
});

describe("flags (thresholds in docs/decisions/021-flex-normalisation.md)", () => {
  // A 70-flex shaft in N and mm: k = 12.26 N/mm.
  const k = flexToNPerM(70) / 1000;
  const line = (mm: number[]) => mm.map((d) => ({ loadN: k * d, deflectionMm: d }));
  const codes = (r: BenchReading[]) => fitBench(r).flags.map((f) => f.code);

  it("none for clean readings with small scatter", () => {
    const wobble = [0.004, -0.003, 0.002, -0.004, 0.003, -0.002];
    expect(codes(line([3, 6, 9, 12, 15, 18]).map((r, i) => ({ ...r, loadN: r.loadN * (1 + wobble[i]) })))).toEqual([]);
  });

  it("non-linear when R² < 0.98", () => {
    const scattered = line([3, 6, 9, 12, 15]).map((r, i) => ({ ...r, loadN: r.loadN * [1, 1.25, 0.8, 1.2, 0.85][i] }));
    const fit = fitBench(scattered);
    expect(fit.r2).toBeLessThan(0.98);
    expect(fit.flags.map((f) => f.code)).toContain("non-linear");
  });

  it("curvature, softening, when load grows slower than the line", () => {
    const soft = [2, 4, 6, 8, 10, 12].map((d) => ({ loadN: k * d - 0.15 * d * d, deflectionMm: d }));
    const flag = fitBench(soft).flags.find((f) => f.code === "curvature");
    expect(flag?.direction).toBe("softening");
    expect(flag?.message).toMatch(/stop loading/);
  });

  it("curvature, stiffening, the other way", () => {
    const stiff = [2, 4, 6, 8, 10, 12].map((d) => ({ loadN: k * d + 0.15 * d * d, deflectionMm: d }));
    expect(fitBench(stiff).flags.find((f) => f.code === "curvature")?.direction).toBe("stiffening");
  });

  it("outlier: one misread reading among four, and it names that reading", () => {
    const readings = line([3, 6, 9, 12]);
    readings[2] = { ...readings[2], deflectionMm: 10.5 };
    const flags = fitBench(readings).flags.filter((f) => f.code === "outlier");
    expect(flags.map((f) => f.readingIndex)).toEqual([2]);
    expect(flags[0].message).toMatch(/reading 3/);
  });

  it("offset when the line misses zero by more than 5 % of the largest load", () => {
    expect(codes(line([3, 6, 9, 12]).map((r) => ({ ...r, loadN: r.loadN + 15 })))).toEqual(["offset"]);
  });
});
