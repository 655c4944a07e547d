// Results as every readout surface prints them, in both unit systems. Conversions are exact by
// definition: 1 km/h = 1/3.6 m/s, 1 mph = 0.44704 m/s, 1 in = 25.4 mm, 1 ft·lbf = 1.3558179483 J (NIST SP 811) [P].
import { describe, expect, it } from "vitest";
import { formatValue, formatWithU, metricDef, metricText, noteMetric, shotTitle } from "../../../shared/schemas/readout";
import { computeShot, syntheticShot } from "../../../shared/mechanics/index";

describe("readout formatting", () => {
  it("speeds, lengths and energies in the viewer's units; times and angles as they are", () => {
    expect(formatWithU("speed", 30, 0.5, "metric")).toBe("108.0 ± 1.8 km/h");
    expect(formatWithU("speed", 30, 0.5, "imperial")).toBe("67.1 ± 1.1 mph");
    expect(formatValue("length", 25.4, "imperial")).toBe("1.00 in");
    expect(formatValue("energy", 1.3558179483, "imperial")).toBe("1.0 ft·lbf");
    expect(formatValue("angle", 7.02, "imperial")).toBe("7.0°");
    expect(formatWithU("time", 25, 0.3125, "imperial")).toBe("25.0 ± 0.3 ms");
    expect(formatValue("speed", null, "metric")).toBe("—");
  });

  it("a metric of the engine's results, and the result a note belongs to", () => {
    const r = computeShot(syntheticShot({ noisePx: 0.2, seed: "fmt" }).doc, { trials: 40 });
    const t = metricText(metricDef("puckExitSpeed"), r, "metric")!;
    expect(Number(t.value)).toBeCloseTo(r.puckExitSpeed.valueMps * 3.6, 1);
    expect(t.unit).toBe("km/h");
    expect(metricText(metricDef("storedEnergy"), { ...r, storedEnergy: null }, "metric")).toBeNull();
    expect(noteMetric("PUCK_FLIGHT_FEW_MARKS")).toBe("puckExitSpeed");
    expect(noteMetric("CONTACT_TIME_OUTSIDE_RANGE")).toBe("contactTime");
    expect(noteMetric("CAPTURE_RATE_LOW")).toBeNull();
  });

  it("a shot without a label is named by what and when", () => {
    expect(shotTitle({ label: "", shotType: "wrist", date: "2026-03-02", playerName: "Theo Marchetti" })).toBe("Wrist shot · Theo Marchetti · 2026-03-02");
    expect(shotTitle({ label: "  Point shot ", shotType: "slap", date: "2026-03-02" })).toBe("Point shot");
  });
});
