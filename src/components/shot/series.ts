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
  const pts = s?.points ?? [];
  const step = pts.length > max ? pts.length / max : 1;
  const out: ChartPoint[] = [];
  for (let i = 0; i < pts.length; i += step) {
    const p = pts[Math.floor(i)];
    out.push({ t: p.tFromStrikeMs, v: convert(p.value), frame: p.frame });
  }
  const last = pts[pts.length - 1];
  if (last && out[out.length - 1]?.frame !== last.frame) out.push({ t: last.tFromStrikeMs, v: convert(last.value), frame: last.frame });
  return out;
}
