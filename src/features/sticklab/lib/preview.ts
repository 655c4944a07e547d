// The live fit beside the bench-test form: the same engine calls the server makes, so what the
// analyst sees before saving is what gets stored.
import { StickLabInputError, fitBench, readingsProblem, readingsToSi, type BenchFit, type BenchReading, type RawReading } from "@shared/mechanics/sticklab";
import { benchUnits, type BenchUnits } from "./bench-units";

export type Preview = { ok: true; fit: BenchFit; readings: BenchReading[] } | { ok: false; message: string; row?: number };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Typed-in rows → numbers; blank rows are left out, a row with text names itself. */
export function rowsToRaw(rows: readonly { load: string; deflection: string }[]): { raw: RawReading[]; index: number[] } | { message: string; row: number } {
  const raw: RawReading[] = [];
  const index: number[] = [];
  for (const [i, r] of rows.entries()) {
    const load = r.load.trim().replace(",", ".");
    const deflection = r.deflection.trim().replace(",", ".");
    if (load === "" && deflection === "") continue;
    if (!NUMBER.test(load)) return { message: `row ${i + 1}: ${load === "" ? "enter the load" : `"${load}" is not a number`}`, row: i };
    if (!NUMBER.test(deflection)) return { message: `row ${i + 1}: ${deflection === "" ? "enter the deflection" : `"${deflection}" is not a number`}`, row: i };
    raw.push({ load: Number(load), deflection: Number(deflection) });
    index.push(i);
  }
  return { raw, index };
}

export function previewFit(raw: readonly RawReading[], units: BenchUnits, options: { spanMm: number; loadPointMm?: number; ratedFlex: number | null }): Preview {
  const u = { load: benchUnits[units].load, deflection: benchUnits[units].deflection };
  const problem = readingsProblem(raw, u);
  if (problem) return { ok: false, message: problem };
  try {
    const readings = readingsToSi(raw, u);
    return { ok: true, readings, fit: fitBench(readings, options) };
  } catch (e) {
    if (e instanceof StickLabInputError) return { ok: false, message: e.message };
    throw e;
  }
}
