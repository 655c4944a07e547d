// CSV exports of one shot: its marks (frame, time, landmark, pixels and world coordinates) and its
// results with uncertainties, in the viewer's units. RFC 4180: comma separated, CRLF line ends,
// fields quoted only when they hold a comma, quote or line break (docs/decisions/092-*).
import { makeCalibration, type CalibrationMap } from "../../shared/mechanics/calibration";
import { engineCalibration, LANDMARKS, landmarkLabels, type ClipCalibration, type ShotMarks } from "../../shared/schemas/shots";
import { METRICS, convert, eventTimingText, frameClockMs, unitOf } from "../../shared/schemas/readout";
import type { ShotResults } from "../../shared/schemas/shot-results";
import type { UnitSystem } from "../../shared/units";

type Cell = string | number | null;

export function csvField(v: Cell): string {
  if (v === null) return "";
  const s = typeof v === "number" ? (Number.isFinite(v) ? String(v) : "") : v;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export const csvLines = (rows: Cell[][]) => rows.map((r) => r.map(csvField).join(",")).join("\r\n") + "\r\n";

/** Rounded for a file people open in a spreadsheet: enough digits for sub-pixel marks and 0.01 ms. */
const r3 = (v: number) => Math.round(v * 1000) / 1000;

export interface MarksExport {
  marks: ShotMarks;
  captureFps: number;
  /** The shot's frames on the clip's own clock (shotFrameTimes), when it has one. */
  frameTimes?: { firstFrame: number; seconds: number[] } | null;
  frameStart: number;
  puckStrike: number | null;
  calibration: ClipCalibration | null;
  units: UnitSystem;
}

export function marksCsv(e: MarksExport): string {
  let cal: CalibrationMap | null = null;
  try {
    cal = e.calibration ? makeCalibration(engineCalibration(e.calibration)) : null;
  } catch {
    cal = null; // a calibration the engine refuses gives no world coordinates, not a failed export
  }
  const lu = unitOf("length", e.units);
  const ms = frameClockMs(e.frameTimes, e.captureFps);
  const header: Cell[] = ["frame", "time_ms", "time_from_puck_strike_ms", "landmark", "x_px", "y_px", `x_${lu}`, `y_${lu}`];
  const rows: { f: number; order: number; cells: Cell[] }[] = [];
  LANDMARKS.forEach((k, order) => {
    for (const [f, x, y] of e.marks[k] ?? []) {
      let wx: Cell = null;
      let wy: Cell = null;
      if (cal && cal.inFront([x, y])) {
        const [X, Y] = cal.toWorld([x, y]);
        wx = r3(convert("length", X, e.units));
        wy = r3(convert("length", Y, e.units));
      }
      rows.push({
        f, order,
        cells: [f, r3(ms(f, e.frameStart)), e.puckStrike === null ? null : r3(ms(f, e.puckStrike)), landmarkLabels[k], r3(x), r3(y), wx, wy],
      });
    }
  });
  rows.sort((p, q) => p.f - q.f || p.order - q.order);
  return csvLines([header, ...rows.map((r) => r.cells)]);
}

export function resultsCsv(r: ShotResults, units: UnitSystem): string {
  const header: Cell[] = ["result", "value", "uncertainty", "interval95_low", "interval95_high", "unit", "note"];
  const rows: Cell[][] = [];
  const interval: Partial<Record<string, [number, number] | null>> = {
    puckExitSpeed: r.puckExitSpeed.interval95Mps,
    bladeSpeedAtStrike: r.bladeSpeedAtStrike?.interval95Mps ?? null,
    peakBend: r.peakBend?.interval95Deg ?? null,
    storedEnergy: r.storedEnergy?.interval95J ?? null,
    loadTime: r.loadTimeInterval95Ms ?? null,
    contactTime: r.contactTimeInterval95Ms ?? null,
  };
  const notes = (prefix: string) => r.notes.filter((n) => n.code.startsWith(prefix)).map((n) => n.message).join("; ") || null;
  const noteFor: Record<string, string | null> = {
    puckExitSpeed: notes("PUCK_"),
    bladeSpeedAtStrike: notes("BLADE_"),
    peakBend: notes("BEND_"),
    loadTime: `times ${eventTimingText(r)}`,
    contactTime: [notes("CONTACT_"), `times ${eventTimingText(r)}`].filter(Boolean).join("; "),
    storedEnergy: notes("STORED_"),
  };
  for (const m of METRICS) {
    const v = m.read(r);
    if (!v) {
      rows.push([m.label, null, null, null, null, unitOf(m.kind, units), "not available for this shot"]);
      continue;
    }
    const c = (x: number) => r3(convert(m.kind, x, units));
    const iv = interval[m.key];
    rows.push([m.label, c(v.value), v.u === null ? null : c(v.u), iv ? c(iv[0]) : null, iv ? c(iv[1]) : null, unitOf(m.kind, units), noteFor[m.key]]);
  }
  const d = r.shaftDeflection;
  if (d) {
    const c = (x: number) => r3(convert("length", x, units));
    rows.push(["Shaft deflection", c(d.valueMm), d.uncertaintyMm === null ? null : c(d.uncertaintyMm), d.interval95Mm ? c(d.interval95Mm[0]) : null, d.interval95Mm ? c(d.interval95Mm[1]) : null, unitOf("length", units), null]);
  }
  rows.push(["Frame time", r3(r.frameTimeMs), null, null, null, "ms", "one frame at the capture rate"]);
  for (const n of r.notes.filter((x) => !/^(PUCK_|BLADE_|CONTACT_|BEND_|STORED_)/.test(x.code))) rows.push(["Note", null, null, null, null, null, n.message]);
  return csvLines([header, ...rows]);
}
