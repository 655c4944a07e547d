// A shot as a three-point bend. The force follows from δ = F a² b² / (3 EI L) (AISC "Beam
// Diagrams and Formulas", case 8) [P]; solving the beam it builds must give back the shot's
// deflection under the bottom hand.
import { describe, expect, it } from "vitest";
import { StickLabInputError, beamAt, beamFromShot, solveBeam } from "../../../shared/mechanics/sticklab";
import { relErr } from "./support";

// A shaft lying along a tilted line, top hand at (100, 50) mm, heel 1200 mm away.
const dir = { x: Math.cos(0.4), y: Math.sin(0.4) };
const normal = { x: -dir.y, y: dir.x };
const along = (s: number, off = 0) => ({ x: 100 + s * dir.x + off * normal.x, y: 50 + s * dir.y + off * normal.y });
const shot = { topHand: along(0), bottomHand: along(350, -24), bladeHeel: along(1200), stickEiNm2: 300 };

describe("beamFromShot", () => {
  it("places the supports at the top hand and heel and the load at the bottom hand's foot on the chord", () => {
    const s = beamFromShot(shot);
    expect(s.input.lengthMm).toBeCloseTo(1200, 9);
    expect(s.input.supportsMm[0]).toBe(0);
    expect(s.input.supportsMm[1]).toBeCloseTo(1200, 9);
    expect(s.aMm).toBeCloseTo(350, 9);
    expect(s.bMm).toBeCloseTo(850, 9);
    expect(s.input.loads[0].xMm).toBeCloseTo(350, 9);
  });

  it("measures the deflection from the points when none is given, and F = 3EI(a+b)/(a²b²)·δ", () => {
    const s = beamFromShot(shot);
    expect(s.deflectionSource).toBe("points");
    expect(s.deflectionMm).toBeCloseTo(24, 9);
    const k = (3 * 300 * 1.2) / (0.35 ** 2 * 0.85 ** 2); // N/m
    expect(relErr(s.forceN, k * 0.024)).toBeLessThan(1e-9);
    expect(relErr(s.stiffnessNPerMm, k / 1000)).toBeLessThan(1e-9);
  });

  it("gives back the shot's deflection under the bottom hand when solved", () => {
    const s = beamFromShot({ ...shot, deflectionMm: 31.5 });
    expect(s.deflectionSource).toBe("given");
    expect(relErr(beamAt(s.input, s.input.loads[0].xMm).deflectionMm!, 31.5)).toBeLessThan(1e-9);
    const r = solveBeam(s.input);
    expect(relErr(r.maxMoment.valueNm, (s.forceN * 0.35 * 0.85) / 1.2)).toBeLessThan(1e-9);
    expect(r.maxMoment.xMm).toBeCloseTo(350, 9);
  });

  it("starts the stick at the butt end when one is given", () => {
    const s = beamFromShot({ ...shot, buttEnd: along(-150) });
    expect(s.input.lengthMm).toBeCloseTo(1350, 9);
    expect(s.input.supportsMm[0]).toBeCloseTo(150, 9);
    expect(s.input.loads[0].xMm).toBeCloseTo(500, 9);
  });

  it.each([
    ["a bottom hand beyond the heel", { ...shot, bottomHand: along(1300, 10) }, /bottom hand must lie between the top hand and the blade heel/],
    ["a bottom hand above the top hand", { ...shot, bottomHand: along(-20, 10) }, /bottom hand must lie between/],
    ["top hand on the heel", { ...shot, bladeHeel: along(0) }, /no length/],
    ["EI zero", { ...shot, stickEiNm2: 0 }, /EI must be greater than zero/],
    ["a negative deflection", { ...shot, deflectionMm: -2 }, /deflection must be a number of mm, zero or more/],
    ["a NaN point", { ...shot, topHand: { x: NaN, y: 0 } }, /topHand must be a point/],
    ["a butt end on the blade side", { ...shot, buttEnd: along(100) }, /butt end must be beyond the top hand/],
  ])("refuses %s", (_name, input, pattern) => {
    expect(() => beamFromShot(input)).toThrow(StickLabInputError);
    expect(() => beamFromShot(input)).toThrow(pattern);
  });
});
