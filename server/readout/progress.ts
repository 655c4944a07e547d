// A player's results across sessions: the points of the trend charts and, per result, the best
// and the typical (median) value. Pure, so it is unit-tested without a database.
import { median } from "simple-statistics";
import { METRICS, type MetricKey, type MetricSummary, type ProgressPoint } from "../../shared/schemas/readout";
import type { ShotResults } from "../../shared/schemas/shot-results";

export type ProgressInput = Omit<ProgressPoint, "values"> & { results: Omit<ShotResults, "series"> | null };

/** Points in time order (by date, then as given), only shots with results. */
export function progressPoints(rows: ProgressInput[]): ProgressPoint[] {
  return rows
    .map((r, i) => ({ r, i }))
    .filter(({ r }) => r.results)
    .sort((x, y) => (x.r.date < y.r.date ? -1 : x.r.date > y.r.date ? 1 : x.i - y.i))
    .map(({ r }) => {
      const values: ProgressPoint["values"] = {};
      for (const m of METRICS) {
        const v = m.read(r.results as ShotResults);
        const note = m.implausible && r.results!.notes.find((n) => n.code === m.implausible);
        if (v && Number.isFinite(v.value)) values[m.key] = note ? { ...v, apart: note.message } : v;
      }
      const { results: _r, ...rest } = r;
      return { ...rest, values };
    });
}

/** A session is its id, or for clips without one the day. */
const sessionKey = (p: ProgressPoint) => p.sessionId ?? `day:${p.date}`;

export function summarise(points: ProgressPoint[]): Record<MetricKey, MetricSummary> {
  const out = {} as Record<MetricKey, MetricSummary>;
  for (const m of METRICS) {
    // A value the engine questioned is no best and no typical: it is counted apart.
    const apart = points.filter((p) => p.values[m.key]?.apart).length;
    const have = points.filter((p) => p.values[m.key] && !p.values[m.key]!.apart);
    const vals = have.map((p) => p.values[m.key]!.value);
    if (!vals.length) {
      out[m.key] = { count: 0, best: null, bestShotId: null, typical: null, firstSession: null, lastSession: null, apart };
      continue;
    }
    let bi = 0;
    for (let i = 1; i < vals.length; i++) if (m.best === "max" ? vals[i] > vals[bi] : vals[i] < vals[bi]) bi = i;
    // Points are in time order, so the first and last keys met are the first and last sessions.
    const sessions: string[] = [];
    for (const p of have) if (!sessions.includes(sessionKey(p))) sessions.push(sessionKey(p));
    const of = (key: string) => median(have.filter((p) => sessionKey(p) === key).map((p) => p.values[m.key]!.value));
    out[m.key] = {
      count: vals.length,
      best: vals[bi],
      bestShotId: have[bi].shotId,
      typical: median(vals),
      firstSession: sessions.length > 1 ? of(sessions[0]) : null,
      lastSession: sessions.length > 1 ? of(sessions[sessions.length - 1]) : null,
      apart,
    };
  }
  return out;
}

/** The type a player shot most (ties in the usual order of types); null when they have none. */
export function mostCommonType<T extends string>(counts: Partial<Record<T, number>>, order: readonly T[]): T | null {
  let best: T | null = null;
  for (const t of order) if ((counts[t] ?? 0) > 0 && (best === null || counts[t]! > counts[best]!)) best = t;
  return best;
}
