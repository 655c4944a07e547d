// The zod schemas of the stick-lab CLI and API inputs: shapes, defaults, and the engine's own
// checks surfacing as issues.
import { describe, expect, it } from "vitest";
import { beamInputSchema, benchTestInputSchema, describeIssues, shotBeamSourceSchema } from "../../../shared/schemas/stick-lab";

const beam = { lengthMm: 1500, supportsMm: [200, 1400], loads: [{ xMm: 600, forceN: 300 }], eiNm2: 310 };
const bench = { date: "2025-11-04", loadUnit: "lbf", deflectionUnit: "in", readings: [{ load: 10, deflection: 0.14 }, { load: 20, deflection: 0.28 }, { load: 30, deflection: 0.42 }] };
const issue = (schema: { safeParse: (v: unknown) => { success: boolean; error?: unknown } }, value: unknown) => {
  const r = schema.safeParse(value);
  expect(r.success).toBe(false);
  return describeIssues(r.error as never);
};

describe("beamInputSchema", () => {
  it("accepts the issue's shape, EI optional", () => {
    expect(beamInputSchema.parse(beam)).toEqual(beam);
    const { eiNm2: _e, ...noEi } = beam;
    expect(beamInputSchema.safeParse(noEi).success).toBe(true);
  });

  it("reports the engine's checks and unknown keys on one line", () => {
    expect(issue(beamInputSchema, { ...beam, supportsMm: [1400, 200] })).toBe("supports must be in order along the stick, x1 < x2 (got 1400 and 200)");
    expect(issue(beamInputSchema, { ...beam, loads: [{ xMm: 1700, forceN: 1 }] })).toMatch(/load 1 at 1700 mm is outside the stick/);
    expect(issue(beamInputSchema, { ...beam, EI: 3 })).toMatch(/Unrecognized key: "EI"/);
    expect(issue(beamInputSchema, { ...beam, eiNm2: 0 })).toMatch(/^eiNm2: /);
    expect(issue(beamInputSchema, { ...beam, loads: [{ xMm: "a", forceN: 1 }] })).toMatch(/^loads\.0\.xMm: /);
    expect(issue(beamInputSchema, { ...beam, supportsMm: [1, 2, 3] })).toMatch(/^supportsMm: /);
  });
});

describe("benchTestInputSchema", () => {
  it("defaults the span to 1,000 mm and the load point to mid-span", () => {
    const t = benchTestInputSchema.parse(bench);
    expect(t.spanMm).toBe(1000);
    expect(t.loadPointMm).toBe(500);
    expect(benchTestInputSchema.parse({ ...bench, spanMm: 600 }).loadPointMm).toBe(300);
    expect(benchTestInputSchema.parse({ ...bench, spanMm: 600, loadPointMm: 200 }).loadPointMm).toBe(200);
  });

  it("refuses a bad date, a load point off the span, unknown units and bad readings", () => {
    expect(issue(benchTestInputSchema, { ...bench, date: "4/11/2025" })).toMatch(/^date: /);
    expect(issue(benchTestInputSchema, { ...bench, loadPointMm: 1000 })).toMatch(/^loadPointMm: the load point must lie between the supports/);
    expect(issue(benchTestInputSchema, { ...bench, loadUnit: "kg" })).toMatch(/^loadUnit: /);
    expect(issue(benchTestInputSchema, { ...bench, readings: bench.readings.slice(0, 2) })).toMatch(/^readings: /);
    expect(issue(benchTestInputSchema, { ...bench, readings: bench.readings.map((r) => ({ ...r, load: 5 })) })).toBe(
      "readings: all loads are equal (5 lbf): use at least two different loads",
    );
    expect(issue(benchTestInputSchema, { ...bench, readings: [{ load: 0, deflection: 0 }, ...bench.readings] })).toBe(
      "readings: row 1: load must be greater than zero (got 0 lbf)",
    );
  });
});

describe("shotBeamSourceSchema", () => {
  it("takes three world points and EI, deflection optional", () => {
    const src = { topHand: { x: 0, y: 0 }, bottomHand: { x: 300, y: 20 }, bladeHeel: { x: 1200, y: 0 }, stickEiNm2: 300 };
    expect(shotBeamSourceSchema.safeParse(src).success).toBe(true);
    expect(issue(shotBeamSourceSchema, { ...src, stickEiNm2: -1 })).toMatch(/^stickEiNm2: /);
    expect(issue(shotBeamSourceSchema, { ...src, topHand: { x: 0 } })).toMatch(/^topHand\.y: /);
  });
});
