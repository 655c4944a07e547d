// The solver's deflection (Macaulay double integration) against an independent method: virtual
// work integrated numerically by scipy.integrate.quad (Debian python3-scipy), on beams with
// overhangs and several loads, where no handbook case applies.
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { beamAt, solveBeam, type BeamInput } from "../../../shared/mechanics/sticklab";

const script = fileURLToPath(new URL("./virtual-work.py", import.meta.url));

function reference(beam: BeamInput, pointsMm: number[]) {
  const out = execFileSync("/usr/bin/python3", [script], { input: JSON.stringify({ ...beam, pointsMm }) });
  return JSON.parse(out.toString()) as { reactionsN: [number, number]; deflectionsMm: number[] };
}

const cases: { name: string; beam: BeamInput }[] = [
  {
    name: "two overhangs, three loads, one of them upward",
    beam: {
      lengthMm: 1600,
      supportsMm: [250, 1300],
      loads: [
        { xMm: 0, forceN: 40 },
        { xMm: 700, forceN: 350 },
        { xMm: 1000, forceN: -120 },
        { xMm: 1600, forceN: 90 },
      ],
      eiNm2: 290,
    },
  },
  {
    name: "supports at the ends, loads on both of them and between",
    beam: {
      lengthMm: 1450,
      supportsMm: [0, 1450],
      loads: [
        { xMm: 0, forceN: 10 },
        { xMm: 333.3, forceN: 210 },
        { xMm: 1111, forceN: 75 },
      ],
      eiNm2: 365,
    },
  },
];

describe.each(cases)("beam vs virtual work (scipy quad): $name", ({ beam }) => {
  const pointsMm = [0, 120, 480, 700, 905.5, 1240, beam.lengthMm];
  const ref = reference(beam, pointsMm);
  const r = solveBeam(beam);
  const scale = Math.max(...ref.deflectionsMm.map(Math.abs));

  it("deflections agree to 1e-9 of the largest", () => {
    pointsMm.forEach((x, i) => {
      expect(Math.abs(beamAt(beam, x).deflectionMm! - ref.deflectionsMm[i])).toBeLessThan(1e-9 * scale);
    });
  });

  it("reactions agree and the largest deflection is no smaller than any reference point", () => {
    expect(r.reactionsN[0]).toBeCloseTo(ref.reactionsN[0], 9);
    expect(r.reactionsN[1]).toBeCloseTo(ref.reactionsN[1], 9);
    expect(Math.abs(r.maxDeflectionMm!)).toBeGreaterThanOrEqual(scale * (1 - 1e-12));
  });
});
