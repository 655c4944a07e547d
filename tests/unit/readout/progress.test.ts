// Progress: best (in each result's own sense) and typical (median) values, and the first and last
// session's medians. Median as defined for an even count: the mean of the two middle values [CP].
import { describe, expect, it } from "vitest";
import { mostCommonType, progressPoints, summarise, type ProgressInput } from "../../../server/readout/progress";
import { computeShot, syntheticShot } from "../../../shared/mechanics/index";

const base = computeShot(syntheticShot({ noisePx: 0.2, seed: "prog", flex: null }).doc, { trials: 40, series: false });
function row(id: string, date: string, session: string | null, exit: number, contact: number): ProgressInput {
  const { series: _s, ...r } = { ...base, puckExitSpeed: { ...base.puckExitSpeed, valueMps: exit }, contactTimeMs: contact };
  return { shotId: id, label: id, date, sessionId: session, venue: null, stickId: null, stickLabel: null, shotType: "slap", results: r };
}

describe("progress", () => {
  const rows = [row("c", "2026-03-01", "s2", 30, 28), row("a", "2026-01-10", "s1", 25, 32), row("b", "2026-01-10", "s1", 27, 30), row("d", "2026-03-01", "s2", 29, 26)];

  it("orders points by date and keeps only shots with results", () => {
    const pts = progressPoints([...rows, { ...row("x", "2026-02-01", null, 1, 1), results: null }]);
    expect(pts.map((p) => p.shotId)).toEqual(["a", "b", "c", "d"]);
    expect(pts[0].values.puckExitSpeed).toEqual({ value: 25, u: base.puckExitSpeed.uncertaintyMps });
  });

  it("best is the highest speed but the shortest contact; typical is the median", () => {
    const s = summarise(progressPoints(rows));
    expect(s.puckExitSpeed).toMatchObject({ count: 4, best: 30, bestShotId: "c", typical: (27 + 29) / 2 });
    expect(s.contactTime).toMatchObject({ best: 26, bestShotId: "d", typical: (28 + 30) / 2 });
    // First session s1 (25, 27), last s2 (30, 29).
    expect(s.puckExitSpeed.firstSession).toBe(26);
    expect(s.puckExitSpeed.lastSession).toBe(29.5);
    expect(s.storedEnergy).toMatchObject({ count: 0, best: null, typical: null });
  });

  it("one session has no first-to-last change; shots without a session group by day", () => {
    const one = summarise(progressPoints([row("a", "2026-01-10", null, 25, 30), row("b", "2026-01-10", null, 28, 30)]));
    expect(one.puckExitSpeed.firstSession).toBeNull();
    const two = summarise(progressPoints([row("a", "2026-01-10", null, 25, 30), row("b", "2026-01-11", null, 28, 30)]));
    expect([two.puckExitSpeed.firstSession, two.puckExitSpeed.lastSession]).toEqual([25, 28]);
  });

  it("a value the engine flags as implausible is set apart: never best, typical or a session's median, but counted apart with its note", () => {
    const flagged = row("z", "2026-03-01", "s2", 61, 28);
    flagged.results = { ...flagged.results!, notes: [...flagged.results!.notes, { code: "PUCK_SPEED_IMPLAUSIBLE", message: "puck exit speed 61.0 m/s is above 52 m/s" }] };
    const pts = progressPoints([...rows, flagged]);
    expect(pts.find((p) => p.shotId === "z")!.values.puckExitSpeed).toMatchObject({ value: 61, apart: "puck exit speed 61.0 m/s is above 52 m/s" });
    // Only the puck speed is questioned: the same shot's contact time counts as usual.
    expect(pts.find((p) => p.shotId === "z")!.values.contactTime!.apart).toBeUndefined();
    const s = summarise(pts);
    expect(s.puckExitSpeed).toMatchObject({ count: 4, best: 30, bestShotId: "c", typical: (27 + 29) / 2, lastSession: 29.5, apart: 1 });
    expect(s.contactTime).toMatchObject({ count: 5, apart: 0 });
  });

  it("the default shot type is the one shot most, ties in the usual order", () => {
    const order = ["slap", "wrist", "snap", "backhand"] as const;
    expect(mostCommonType({ wrist: 5, slap: 3 }, order)).toBe("wrist");
    expect(mostCommonType({ snap: 2, wrist: 2 }, order)).toBe("wrist");
    expect(mostCommonType({}, order)).toBeNull();
  });
});
