// The differences of a comparison, in words: who loaded the stick longer, who released faster.
import { describe, expect, it } from "vitest";
import { difference, differences } from "../../../src/features/compare/lib/differences";
import { metricDef } from "../../../shared/schemas/readout";
import { computeShot, syntheticShot } from "../../../shared/mechanics/index";
import type { ShotResults } from "../../../shared/schemas/shot-results";

const names = { a: "Shot A", b: "Shot B" };
const base = computeShot(syntheticShot({ noisePx: 0.2, seed: "diff", flex: null }).doc, { trials: 40 });
// Each event marked to ±1 frame: a time between two events has u = √(2/3) frame (event-timing.ts).
const withTimes = (load: number, contact: number, frameMs = 0.3125): ShotResults => {
  const u = frameMs * Math.sqrt(2 / 3);
  return { ...base, loadTimeMs: load, contactTimeMs: contact, frameTimeMs: frameMs, loadTimeUncertaintyMs: u, contactTimeUncertaintyMs: u };
};

describe("differences", () => {
  it("says which shot loaded the stick longer and which released sooner", () => {
    const a = withTimes(30, 25);
    const b = withTimes(25, 30, 1);
    const load = difference(metricDef("loadTime"), a, b, "metric", names);
    expect(load).toMatchObject({ winner: "a", clear: true, sentence: "Shot A loaded the stick 5.0 ms longer" });
    expect(load.diff).toBe(-5);
    const release = difference(metricDef("contactTime"), a, b, "metric", names);
    expect(release).toMatchObject({ winner: "a", sentence: "Shot A released 5.0 ms sooner" });
  });

  it("a difference within twice the combined uncertainty names no winner", () => {
    // 1000 fps, events to ±1 frame: u = 0.82 ms a shot, 1.15 ms combined; 2 ms is inside 2u = 2.31 ms.
    const d = difference(metricDef("loadTime"), withTimes(25, 30, 1), withTimes(27, 30, 1), "metric", names);
    expect(d).toMatchObject({ clear: false, winner: null, sentence: "Load time about the same (within the measurement)" });
  });

  it("speeds in the viewer's units; a missing result says for which shot", () => {
    const faster = { ...base, puckExitSpeed: { ...base.puckExitSpeed, valueMps: base.puckExitSpeed.valueMps + 5, uncertaintyMps: 0.2 } };
    const a = { ...base, puckExitSpeed: { ...base.puckExitSpeed, uncertaintyMps: 0.2 } };
    // 5 m/s = 18.0 km/h = 11.2 mph (1 mph = 0.44704 m/s exactly) [P].
    expect(difference(metricDef("puckExitSpeed"), a, faster, "metric", names).sentence).toBe("Shot B's puck left 18.0 km/h faster");
    expect(difference(metricDef("puckExitSpeed"), a, faster, "imperial", names).sentence).toBe("Shot B's puck left 11.2 mph faster");
    const all = differences(base, null, "metric", names);
    expect(all.map((d) => d.sentence)).toEqual([...Array(5).fill("Not available for Shot B"), "Not available for either shot"]); // no stick: no energy for A either
    expect(difference(metricDef("storedEnergy"), base, base, "metric", names).sentence).toBe("Not available for either shot");
  });
});
