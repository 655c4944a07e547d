// Readings CSV: good files come out in SI by the exact unit definitions (1 in = 25.4 mm,
// 1 lbf = 4.4482216152605 N; NIST SP 811) [P]; every kind of bad file gets a message naming it.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { READINGS_LIMITS, StickLabInputError, parseReadingsCsv, readingsProblem, readingsToSi } from "../../../shared/mechanics/sticklab";
import { fixture } from "./support";

const refuses = (text: string | Uint8Array, pattern: RegExp, row?: number) => {
  let caught: unknown;
  try {
    parseReadingsCsv(text);
  } catch (err) {
    caught = err;
  }
  expect(caught).toBeInstanceOf(StickLabInputError);
  expect((caught as Error).message).toMatch(pattern);
  expect((caught as Error).message).not.toMatch(/\n/);
  if (row !== undefined) expect((caught as StickLabInputError).row).toBe(row);
};

describe("parseReadingsCsv: good files", () => {
  it("reads lbf and in and converts exactly", () => {
    const p = parseReadingsCsv(readFileSync(fixture("used-85-stick.csv"), "utf8"));
    expect(p.units).toEqual({ load: "lbf", deflection: "in" });
    expect(p.raw[0]).toEqual({ load: 10, deflection: 0.14 });
    expect(p.readings[0].loadN).toBe(10 * 4.4482216152605);
    expect(p.readings[0].deflectionMm).toBe(0.14 * 25.4);
    expect(p.lines).toEqual([2, 3, 4, 5]);
  });

  it("reads N and mm with a comment line, a note column, quotes and spaces in the header", () => {
    const p = parseReadingsCsv(readFileSync(fixture("metric-readings.csv")));
    expect(p.units).toEqual({ load: "N", deflection: "mm" });
    expect(p.readings).toHaveLength(5);
    expect(p.readings[4]).toEqual({ loadN: 250, deflectionMm: 16.9 });
    expect(p.lines[0]).toBe(3);
  });

  it("skips the rows of bare commas a spreadsheet leaves at the end", () => {
    expect(parseReadingsCsv("load_n,deflection_mm\n10,1\n20,2\n30,3\n,\n,\n").readings).toHaveLength(3);
  });

  it("takes a byte-order mark, CRLF line ends, mixed-case headers and exponents", () => {
    const p = parseReadingsCsv("\uFEFF Load_N , DEFLECTION_MM\r\n1e1,1\r\n20,2.0\r\n\r\n3.0E1,3\r\n");
    expect(p.readings.map((r) => r.loadN)).toEqual([10, 20, 30]);
  });
});

describe("parseReadingsCsv: bad files", () => {
  it.each([
    ["an empty file", "", /the file is empty/],
    ["only blank lines", "\n \n\n", /the file is empty/],
    ["a header only", "load_lbf,deflection_in\n", /need at least 3 readings to fit a line, got 0/],
    ["two readings", "load_lbf,deflection_in\n10,0.1\n20,0.2\n", /need at least 3 readings to fit a line, got 2/],
    ["a missing load column", "weight,deflection_in\n10,0.1\n20,0.2\n30,0.3\n", /missing column load_lbf or load_n \(header: weight,deflection_in\)/],
    ["a missing deflection column", "load_n\n10\n20\n30\n", /missing column deflection_in or deflection_mm/],
    ["an unknown load unit", "load_kg,deflection_mm\n1,1\n2,2\n3,3\n", /column "load_kg": unknown unit "kg"; use load_lbf or load_n/],
    ["an unknown deflection unit", "load_n,deflection_cm\n1,1\n2,2\n3,3\n", /column "deflection_cm": unknown unit "cm"; use deflection_in or deflection_mm/],
    ["a unit-less column", "load,deflection_mm\n1,1\n2,2\n3,3\n", /column "load": unknown unit "\(none\)"/],
    ["two load columns", "load_n,load_lbf,deflection_mm\n1,1,1\n", /more than one load column \(load_n, load_lbf\)/],
    ["a zero load", "load_n,deflection_mm\n0,0\n10,1\n20,2\n", /line 2: load must be greater than zero \(got 0 N\)/, 2],
    ["a negative load", "load_lbf,deflection_in\n10,0.1\n-20,0.2\n30,0.3\n", /line 3: load must be greater than zero \(got -20 lbf\)/, 3],
    ["a negative deflection", "load_n,deflection_mm\n10,1\n20,-2\n30,3\n", /line 3: deflection must not be negative/, 3],
    ["all loads equal", "load_n,deflection_mm\n10,1\n10,2\n10,3\n", /all loads are equal \(10 N\): use at least two different loads/],
    ["all deflections equal", "load_n,deflection_mm\n10,1\n20,1\n30,1\n", /all deflections are equal/],
    ["an unclosed quote", 'load_n,deflection_mm\n10,1\n20,"2\n30,3\n', /could not read the CSV near line/],
    ["a row with too many cells (decimal commas?)", "load_n,deflection_mm\n10,1\n20,2,5\n30,3\n", /line 3 has 3 cells but the header has 2/, 3],
    ["a row with too few cells", "load_n,deflection_mm\n10,1\n20\n30,3\n", /line 3 has 1 cell but the header has 2/, 3],
  ])("refuses %s", (_name, text, pattern, row?) => refuses(text, pattern, row));

  it.each([
    ["a word", "ten", /line 3, column load_lbf: "ten" is not a number/],
    ["a unit suffix", "20lbf", /"20lbf" is not a number/],
    ["hex", "0x14", /"0x14" is not a number/],
    ["Infinity", "Infinity", /"Infinity" is not a number/],
    ["an empty cell", "", /line 3, column load_lbf: empty cell/],
  ])("refuses text in a number cell: %s, naming row and column", (_name, cell, pattern) =>
    refuses(`load_lbf,deflection_in\n10,0.1\n${cell},0.2\n30,0.3\n`, pattern, 3),
  );

  it("names the deflection column when that cell is the bad one", () => {
    refuses("load_n,deflection_mm\n10,1\n20,2\n30,three\n", /line 4, column deflection_mm: "three" is not a number/, 4);
  });

  it("refuses a file over 1 MB, as text and as bytes, before parsing it", () => {
    const big = "load_n,deflection_mm\n" + "100,1.000000\n".repeat(80_000);
    expect(big.length).toBeGreaterThan(READINGS_LIMITS.maxBytes);
    refuses(big, /the file is too large: \d+ bytes \(the limit is 1000000 bytes\)/);
    refuses(new TextEncoder().encode(big), /the file is too large/);
  });

  it("refuses more than 10,000 readings even under 1 MB", () => {
    const rows = Array.from({ length: 10_001 }, (_, i) => `${i + 1},${i + 1}`).join("\n");
    expect(rows.length).toBeLessThan(READINGS_LIMITS.maxBytes);
    refuses(`load_n,deflection_mm\n${rows}\n`, /too many readings: more than 10000 rows/);
  });
});

describe("readings typed into a table", () => {
  it("are checked with the same words, numbered from row 1", () => {
    expect(readingsProblem([{ load: 5, deflection: 1 }, { load: -1, deflection: 2 }, { load: 7, deflection: 3 }], { load: "lbf", deflection: "in" })).toBe(
      "row 2: load must be greater than zero (got -1 lbf)",
    );
    expect(readingsProblem([{ load: 5, deflection: 1 }, { load: 6, deflection: 2 }, { load: 7, deflection: 3 }], { load: "N", deflection: "mm" })).toBeNull();
  });

  it("convert to SI, and refuse NaN with the row", () => {
    expect(readingsToSi([{ load: 1, deflection: 1 }, { load: 2, deflection: 2 }, { load: 3, deflection: 3 }], { load: "lbf", deflection: "mm" })[2]).toEqual({
      loadN: 3 * 4.4482216152605,
      deflectionMm: 3,
    });
    expect(() => readingsToSi([{ load: 1, deflection: 1 }, { load: NaN, deflection: 2 }, { load: 3, deflection: 3 }], { load: "N", deflection: "mm" })).toThrow(
      "row 2: load is not a number",
    );
  });
});
