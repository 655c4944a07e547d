import type { ShotResults } from "@shared/schemas/shot-results";

type Series = ShotResults["series"]["puckSpeed"];

// Engine series (SI, every frame) → chart points in the viewer's units, time from puck strike.

export interface ChartPoint {
  t: number;
  v: number;
  frame: number;
}

/** Every point, or an even thinning to at most `max` (a 3,200 fps shot has thousands). */
export function chartPoints(s: Series | undefined, convert: (si: number) => number, max = 600): ChartPoint[] {
  const n = s?.frame.length ?? 0;
  if (!s || n === 0) return [];
  const at = (i: number): ChartPoint => ({ t: s.tFromStrikeMs[i], v: convert(s.value[i]), frame: s.frame[i] });
  const step = n > max ? n / max : 1;
  const out: ChartPoint[] = [];
  for (let i = 0; i < n; i += step) out.push(at(Math.floor(i)));
  if (out[out.length - 1].frame !== s.frame[n - 1]) out.push(at(n - 1));
  return out;
}

/** Round ticks inside [lo, hi] (multiples of 1, 2 or 5 × 10ⁿ, about `count`), so a time axis reads −40, −20, 0, 20 … */
export function roundTicksWithin(lo: number, hi: number, count = 6): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).reduce((b, s) => (Math.abs(Math.log(s / raw)) < Math.abs(Math.log(b / raw)) ? s : b));
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}
