// Export formats: CSV quoting by RFC 4180 §2 [P] (a field with a comma, a double quote or a line
// break is enclosed in double quotes; a double quote inside is doubled), read back with csv-parse
// as the reference reader; the PDF's chart ticks; the ASCII file names.
import { describe, expect, it } from "vitest";
import { parse } from "csv-parse/sync";
import { csvField, csvLines, marksCsv } from "../../../server/readout/csv";
import { fileStem } from "../../../server/readout/exports";
import { eventsOf } from "../../../server/readout/present";
import { linePath, niceTicks, placeEventLabels, thin } from "../../../server/readout/pdf/chart-geometry";

describe("CSV", () => {
  it("quotes only what needs quoting, and csv-parse reads it back unchanged", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField('Theo "the cannon"')).toBe('"Theo ""the cannon"""');
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField(null)).toBe("");
    expect(csvField(Number.NaN)).toBe("");
    const cells = [["label", "note"], ["Slap, point", 'said "fast"\nthen left'], ["x", 1.5]];
    const text = csvLines(cells);
    expect(text.endsWith("\r\n")).toBe(true);
    expect(parse(text)).toEqual(cells.map((r) => r.map(String)));
  });

  it("marks: time from the capture rate, world position from the scale bar, blank when uncalibrated", () => {
    const marks = { puck: [[11, 120, 50]] as [number, number, number][], bladeHeel: [[10, 100, 50]] as [number, number, number][] };
    const cal = { type: "scaleBar" as const, a: [100, 50] as [number, number], b: [110, 50] as [number, number], lengthMm: 20, lengthUnit: "mm" as const };
    const rows = parse(marksCsv({ marks, captureFps: 2000, frameStart: 1, puckStrike: 11, calibration: cal, units: "metric" }), { columns: true }) as Record<string, string>[];
    // Sorted by frame: the heel (frame 10) first. 9 frames at 2000 fps = 4.5 ms; 2 mm per px.
    expect(rows.map((r) => r.landmark)).toEqual(["Blade heel", "Puck"]);
    expect(rows[0]).toMatchObject({ frame: "10", time_ms: "4.5", time_from_puck_strike_ms: "-0.5", x_mm: "0", y_mm: "0" });
    expect(rows[1]).toMatchObject({ x_px: "120", x_mm: "40", y_mm: "0" });
    const bare = parse(marksCsv({ marks, captureFps: 2000, frameStart: 1, puckStrike: null, calibration: null, units: "imperial" }), { columns: true }) as Record<string, string>[];
    expect(bare[1]).toMatchObject({ time_from_puck_strike_ms: "", x_in: "", y_in: "" });
  });

  it("marks and events on a clip with dropped frames: times from the clip's own clock, not frame ÷ rate", () => {
    // Frames 1..12 at 2000 fps with three frames lost after frame 5: frame 6 is 4 intervals after frame 5.
    const seconds = Array.from({ length: 12 }, (_, i) => (i < 5 ? i : i + 3) / 2000);
    const frameTimes = { firstFrame: 1, seconds };
    const marks = { puck: [[11, 120, 50]] as [number, number, number][], bladeHeel: [[4, 100, 50]] as [number, number, number][] };
    const rows = parse(marksCsv({ marks, captureFps: 2000, frameTimes, frameStart: 1, puckStrike: 4, calibration: null, units: "metric" }), { columns: true }) as Record<string, string>[];
    expect(rows[0]).toMatchObject({ frame: "4", time_ms: "1.5", time_from_puck_strike_ms: "0" });
    expect(rows[1]).toMatchObject({ frame: "11", time_ms: "6.5", time_from_puck_strike_ms: "5" });
    const release = eventsOf({ events: { puckStrike: 4, release: 11 }, frameStart: 1, captureFps: 2000, frameTimes }).find((e) => e.key === "release")!;
    expect(release.tMs).toBeCloseTo(6.5, 9);
    expect(release.tFromStrikeMs).toBeCloseTo(5, 9);
    // Without a clock of its own, frame ÷ rate as before.
    expect(eventsOf({ events: { puckStrike: 4, release: 11 }, frameStart: 1, captureFps: 2000 }).find((e) => e.key === "release")).toMatchObject({ tMs: 5, tFromStrikeMs: 3.5 });
  });

  it("file names are plain ASCII", () => {
    expect(fileStem("Theo's gamer — 85 flex · 2026-03-02", "abcdef12-…")).toBe("theo-s-gamer-85-flex-2026-03-02");
    expect(fileStem("—", "abcdef1234")).toBe("shot-abcdef12");
  });
});

describe("report chart geometry", () => {
  it("round ticks of 1, 2 or 5 × 10ⁿ that cover the range", () => {
    expect(niceTicks(0, 100, 5)).toEqual([0, 20, 40, 60, 80, 100]);
    expect(niceTicks(-57.5, 67.2, 6)).toEqual([-60, -40, -20, 0, 20, 40, 60, 80]);
    expect(niceTicks(0.1, 0.9, 4)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
  });

  it("paths break at gaps; thinning keeps both ends", () => {
    expect(linePath([{ x: 0, y: 0 }, { x: 1, y: Number.NaN }, { x: 2, y: 2 }, { x: 3, y: 3 }])).toBe("M0.00 0.00 M2.00 2.00 L3.00 3.00");
    const t = thin(Array.from({ length: 1000 }, (_, i) => i), 10);
    expect(t).toHaveLength(10);
    expect([t[0], t[9]]).toEqual([0, 999]);
  });
});

describe("the PDF's event labels", () => {
  const overlaps = (a: { x0: number; x1: number; row: number }, b: { x0: number; x1: number; row: number }) => a.row === b.row && a.x0 < b.x1 && b.x0 < a.x1;
  it("four events a few points apart (ice strike, puck strike, peak bend, release) go in rows with no two labels overlapping", () => {
    // A 60 ms chart 216 pt wide: events 1.2 ms apart are ~4 pt apart, closer than any label is long.
    const toX = (ms: number) => 34 + ((ms + 30) / 60) * 216;
    const items = [["Ice strike", -1.2], ["Puck strike", 0], ["Peak bend", 3.1], ["Release", 4.4]].map(([text, ms]) => ({ text: String(text), x: toX(Number(ms)) }));
    const placed = placeEventLabels(items, { fontSize: 5.5, right: 250 });
    for (let i = 0; i < placed.length; i++) for (let j = i + 1; j < placed.length; j++) expect(overlaps(placed[i], placed[j]), `${items[i].text} / ${items[j].text}`).toBe(false);
    // Before: two alternating rows, so the 1st and 3rd labels (≈ 19 pt apart, each ≈ 30 pt long) collided.
    expect(new Set(placed.map((p) => p.row)).size).toBeGreaterThan(2);
  });
  it("labels far apart share the first row; one near the right edge is drawn to the left of its line", () => {
    const placed = placeEventLabels([{ text: "Ice strike", x: 40 }, { text: "Release", x: 150 }, { text: "Release", x: 248 }], { fontSize: 5.5, right: 250 });
    expect(placed.map((p) => p.row)).toEqual([0, 0, 0]);
    expect(placed[2]).toMatchObject({ anchor: "end" });
    expect(placed[2].x1).toBeLessThanOrEqual(248);
  });
});
