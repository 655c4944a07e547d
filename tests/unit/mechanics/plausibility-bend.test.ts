// Plausibility of bend, deflection and stored energy (bounds and sources: shared/mechanics/
// plausibility.ts — [calc] from a flex test's geometry and the fastest recorded shot's puck, [CP]).
// Issue 16: a bottom-hand mark 300 mm off the shaft gave 51° and 336 J with no note.
import { describe, expect, it } from "vitest";
import { computeShot, syntheticShot } from "../../../shared/mechanics/index";
import { MAX_PLAUSIBLE_BEND_DEG, MAX_PLAUSIBLE_ENERGY_J } from "../../../shared/mechanics/plausibility";
import { noteMetric } from "../../../shared/schemas/readout";

describe("bend and stored energy plausibility", () => {
  const { doc } = syntheticShot({ captureFps: 1000, frames: 300, noisePx: 0.3, seed: "plausible", flex: 100 });

  it("[calc] the bounds: 20° and the 201 J the fastest recorded shot's 170 g puck carried at 48.64 m/s", () => {
    expect(MAX_PLAUSIBLE_BEND_DEG).toBe(20);
    expect(MAX_PLAUSIBLE_ENERGY_J).toBeCloseTo(201.1, 1);
  });

  it("an ordinary shot has no bend, deflection or energy note", () => {
    const codes = computeShot(doc, { trials: 40, series: false }).notes.map((n) => n.code);
    expect(codes.filter((c) => /^(BEND_|STORED_ENERGY_)/.test(c))).toEqual([]);
  });

  it("a bottom-hand mark 300 mm off the shaft is flagged on bend, deflection and energy", () => {
    const offPx = 300 / 1.905; // the synthetic shot's scale: 1.905 mm per px
    const bottomHand = doc.tracks.bottomHand!.map(([f, x, y]) => [f, x + offPx, y] as [number, number, number]);
    const r = computeShot({ ...doc, tracks: { ...doc.tracks, bottomHand } }, { trials: 40, series: false });
    expect(r.peakBend!.angleDeg).toBeGreaterThan(MAX_PLAUSIBLE_BEND_DEG);
    expect(r.storedEnergy!.valueJ).toBeGreaterThan(MAX_PLAUSIBLE_ENERGY_J);
    const codes = r.notes.map((n) => n.code);
    expect(codes).toEqual(expect.arrayContaining(["BEND_IMPLAUSIBLE", "BEND_DEFLECTION_IMPLAUSIBLE", "STORED_ENERGY_IMPLAUSIBLE"]));
    // Shown on the readout's bend and energy cards.
    expect(noteMetric("BEND_DEFLECTION_IMPLAUSIBLE")).toBe("peakBend");
    expect(noteMetric("STORED_ENERGY_IMPLAUSIBLE")).toBe("storedEnergy");
  });
});
