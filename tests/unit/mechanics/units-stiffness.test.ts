// Test 4 of issue 5: unit conversions (exact by definition: 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N,
// 1 mph = 0.44704 m/s, 1 km/h = 1/3.6 m/s — NIST SP 811 appendix B [P]) and the flex → EI example
// of REFERENCES.md (*calc*: k = flex × 175.127 N/m, EI = k·L³/48), then the stored-energy formula
// against the point-load beam deflection (AISC "Beam Diagrams and Formulas", case 8 [P]).
import { describe, expect, it } from "vitest";
import { eiFromFlex } from "../../../shared/mechanics/bench-fit-normalise";
import { pointLoadStiffness, storedEnergy } from "../../../shared/mechanics/index";
import { flexToNPerM, inToMm, kmhToMps, lbfToN, mphToMps, mpsToKmh, NPM_PER_LBF_PER_IN } from "../../../shared/units";

describe("unit conversions (exact definitions)", () => {
  it("inch, pound-force, mile per hour, km/h", () => {
    expect(inToMm(1)).toBe(25.4);
    expect(lbfToN(1)).toBe(4.4482216152605);
    expect(mphToMps(1)).toBe(0.44704);
    expect(kmhToMps(3.6)).toBeCloseTo(1, 15);
  });
  it("[P] fastest skills-competition slap shot 108.8 mph = 48.64 m/s = 175.10 km/h", () => {
    expect(mphToMps(108.8)).toBeCloseTo(48.64, 2);
    expect(mpsToKmh(mphToMps(108.8))).toBeCloseTo(175.1, 1);
  });
  it("[calc] 1 lbf/in = 175.127 N/m", () => {
    expect(NPM_PER_LBF_PER_IN).toBeCloseTo(175.127, 3);
  });
});

describe("flex → stiffness → EI (REFERENCES.md worked example)", () => {
  it("85 flex on 1 m: k = 14.886 kN/m, EI = 310.1 N·m²", () => {
    expect(flexToNPerM(85) / 1000).toBeCloseTo(14.886, 3);
    expect(eiFromFlex(85, 1000)).toBeCloseTo(310.1, 1);
  });
  it("100 flex on 1 m: k = 17.51 kN/m, EI = 364.8 N·m²", () => {
    expect(flexToNPerM(100) / 1000).toBeCloseTo(17.51, 2);
    expect(eiFromFlex(100, 1000)).toBeCloseTo(364.8, 1);
  });
});

describe("stored energy in the shaft", () => {
  it("a centre load on the bench span gives back the flex stiffness (48 EI / L³)", () => {
    const ei = eiFromFlex(85, 1000);
    expect(pointLoadStiffness(ei, 0.5, 0.5)).toBeCloseTo(flexToNPerM(85), 6);
  });

  it("U = ½·F·δ with δ = F a² b² / (3 EI L) for a load off-centre (AISC case 8)", () => {
    const ei = eiFromFlex(85, 1000);
    const a = 0.585;
    const b = 0.715;
    const F = 250; // N at the bottom hand
    const deltaM = (F * a * a * b * b) / (3 * ei * (a + b));
    const e = storedEnergy(85, 1000, { deflectionMm: deltaM * 1000, aMm: a * 1000, bMm: b * 1000 });
    expect(e).not.toBeNull();
    expect(e!.valueJ).toBeCloseTo(0.5 * F * deltaM, 9);
    expect(e!.eiNm2).toBeCloseTo(310.12, 2);
  });

  it("no energy when the bottom hand falls outside the chord", () => {
    expect(storedEnergy(85, 1000, { deflectionMm: 20, aMm: -10, bMm: 1310 })).toBeNull();
  });
});
