// Stiffness history against the rating and a team's alert mark. Figures are invented demo data;
// "used sticks measure softer than their printed rating" is [CP].
import { describe, expect, it } from "vitest";
import { flexHistory } from "../../../shared/mechanics/sticklab";

const season = [
  { date: "2026-01-10", measuredFlex: 76.2, shotsTaken: 900 },
  { date: "2025-09-01", measuredFlex: 84.1, shotsTaken: 0 },
  { date: "2025-11-02", measuredFlex: 79.9, shotsTaken: 420 },
];

describe("flexHistory", () => {
  it("orders by date and gives % of rated per test", () => {
    const h = flexHistory(season, 85, 90);
    expect(h.points.map((p) => p.date)).toEqual(["2025-09-01", "2025-11-02", "2026-01-10"]);
    expect(h.points[0].percentOfRated).toBeCloseTo((100 * 84.1) / 85, 12);
    expect(h.points.map((p) => p.belowAlert)).toEqual([false, false, true]);
  });

  it("writes a notice only when the latest test is below the mark", () => {
    expect(flexHistory(season, 85, 90).notice).toBe("Measured 76.2 flex on 2026-01-10: 89.6 % of its 85 rating, below the team's 90 % mark.");
    expect(flexHistory(season, 85, 80).notice).toBeNull();
    expect(flexHistory([], 85, 80)).toEqual({ points: [], notice: null });
  });

  it("has no percentages or notice without a rating, and refuses a bad mark", () => {
    const h = flexHistory(season, null, 90);
    expect(h.points.every((p) => p.percentOfRated === null && !p.belowAlert)).toBe(true);
    expect(h.notice).toBeNull();
    expect(() => flexHistory(season, 85, 0)).toThrow(/alert mark must be a percentage/);
    expect(() => flexHistory(season, -1, 80)).toThrow(/rated flex must be a number greater than zero/);
  });
});
