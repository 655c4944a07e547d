// The stored form of a readout chart's samples (decision 202): columns, runs of segments, and
// numbers kept to 6 significant digits / the ns, printed short by JSON.
import { describe, expect, it } from "vitest";
import { computeShot, Series, syntheticShot } from "../../../shared/mechanics/index";
import { SeriesColumns, seriesPoints, toNanosecond, toSignificant } from "../../../shared/mechanics/series-columns";

describe("toSignificant", () => {
  it("keeps 6 significant digits at every scale and prints them short", () => {
    const cases: [number, string][] = [
      [0.004908872233077111, "0.00490887"],
      [31.415926535, "31.4159"],
      [-42.08333333333333, "-42.0833"],
      [123456789, "123457000"],
      [2.5e-9, "2.5e-9"],
      [0, "0"],
    ];
    for (const [v, printed] of cases) expect(JSON.stringify(toSignificant(v))).toBe(printed);
    // Against JavaScript's own decimal rounding (ECMA-262 Number.prototype.toPrecision [P]), 10,000 values over 12 decades.
    let x = 0.7;
    for (let i = 0; i < 10_000; i++) {
      x = (x * 9301 + 49297) % 233280;
      const v = (x / 233280 - 0.5) * 10 ** ((i % 12) - 6);
      expect(toSignificant(v)).toBe(Number(v.toPrecision(6)));
    }
  });

  it("leaves what has no digits to round alone", () => {
    expect(toSignificant(Number.NaN)).toBeNaN();
    expect(toSignificant(Infinity)).toBe(Infinity);
    expect(toNanosecond(-41.666666666666664)).toBe(-41.666667);
    expect(toNanosecond(0.3125)).toBe(0.3125);
  });
});

describe("SeriesColumns", () => {
  it("builds equal columns and runs of segments that give the samples back", () => {
    const b = new SeriesColumns("m/s");
    const samples = [
      [10, -0.625, 1.5, "beforeStrike"],
      [11, -0.3125, 2.25, "beforeStrike"],
      [12, 0, 3, "beforeStrike"],
      [12, 0, 2.4, "afterStrike"],
      [13, 0.3125, 2.5, "contact"],
      [14, 0.625, 30.123456789, "afterRelease"],
    ] as const;
    for (const [f, t, v, s] of samples) b.push(f, t, v, s);
    const s = b.done();
    expect(s).toEqual({ unit: "m/s", frame: [10, 11, 12, 12, 13, 14], tFromStrikeMs: [-0.625, -0.3125, 0, 0, 0.3125, 0.625], value: [1.5, 2.25, 3, 2.4, 2.5, 30.1235], segments: [["beforeStrike", 3], ["afterStrike", 1], ["contact", 1], ["afterRelease", 1]] });
    expect(Series.safeParse(s).success).toBe(true);
    expect(seriesPoints(s).map((p) => [p.frame, p.tFromStrikeMs, p.value, p.segment])).toEqual(samples.map(([f, t, v, seg]) => [f, t, toSignificant(v), seg]));
  });

  it("is refused by the results' shape when its columns or runs disagree", () => {
    const good = { unit: "deg", frame: [1, 2], tFromStrikeMs: [0, 1], value: [3, 4], segments: [["beforeStrike", 2]] };
    expect(Series.safeParse(good).success).toBe(true);
    expect(Series.safeParse({ ...good, value: [3] }).success).toBe(false);
    expect(Series.safeParse({ ...good, segments: [["beforeStrike", 1]] }).success).toBe(false);
    expect(Series.safeParse({ ...good, segments: [["sideways", 2]] }).success).toBe(false);
  });

  it("a shot's three series print at a quarter of the size of an object a sample", () => {
    const r = computeShot(syntheticShot({ frames: 400, noisePx: 0.3, seed: "cols" }).doc, { trials: 30 });
    const columns = JSON.stringify(r.series).length;
    const objects = JSON.stringify(
      Object.fromEntries((["puckSpeed", "bladeSpeed", "bendAngle"] as const).map((k) => [k, seriesPoints(r.series[k]).map((p) => ({ tMs: p.tFromStrikeMs + 40.123456789012, ...p, value: p.value + 1e-13 }))])),
    ).length;
    console.log(`series of ${seriesPoints(r.series.puckSpeed).length + seriesPoints(r.series.bladeSpeed).length + seriesPoints(r.series.bendAngle).length} samples: ${columns} characters as columns, ${objects} as full-precision objects (×${(objects / columns).toFixed(1)})`);
    expect(objects / columns).toBeGreaterThan(3);
  });
});
