import { describe, expect, it } from "vitest";
import { formatQuantity, formatWithUncertainty, unitLabel } from "@/lib/units";

const en = { locale: "en-US" };

// Display formatting over shared/units.ts. Factors are exact by definition (1 mph = 0.44704 m/s,
// 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N; NIST SP 811 appendix B). The locale is pinned so
// the machine's language cannot change the decimal mark.

describe("formatQuantity", () => {
  it("shows 40 m/s as 144.0 km/h and 89.5 mph", () => {
    expect(formatQuantity("speed", 40, "metric", en)).toBe("144.0 km/h"); // 40 × 3.6
    expect(formatQuantity("speed", 40, "imperial", en)).toBe("89.5 mph"); // 40 / 0.44704 = 89.477
  });

  it("shows lengths in mm or inches and forces in N or lbf", () => {
    expect(formatQuantity("length", 25.4, "imperial", { digits: 2, locale: "en-US" })).toBe("1.00 in");
    expect(formatQuantity("force", 444.82216152605, "imperial", en)).toBe("100 lbf");
    expect(formatQuantity("force", 100, "metric", en)).toBe("100 N");
  });

  it("shows a dash for a missing or non-finite value rather than NaN", () => {
    expect(formatQuantity("speed", null, "metric", en)).toBe("—");
    expect(formatQuantity("speed", Number.NaN, "metric", en)).toBe("—");
  });

  it("can leave the unit off for columns whose header carries it", () => {
    expect(formatQuantity("speed", 10, "metric", { bare: true, locale: "en-US" })).toBe("36.0");
    expect(unitLabel("energy", "imperial")).toBe("ft·lbf");
  });
});

describe("formatWithUncertainty", () => {
  it("scales the ± by the same factor as the value", () => {
    expect(formatWithUncertainty("speed", 40, 0.5, "metric", en)).toBe("144.0 ± 1.8 km/h"); // 0.5 × 3.6
    expect(formatWithUncertainty("speed", 40, 0.44704, "imperial", en)).toBe("89.5 ± 1.0 mph");
  });

  it("falls back to the plain value when the uncertainty is unknown", () => {
    expect(formatWithUncertainty("energy", 12.34, null, "metric", en)).toBe("12.3 J");
  });
});
