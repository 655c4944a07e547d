// The geometry of a small line chart for the PDF (the page's charts are drawn by recharts in the
// browser; the report is drawn here as plain SVG paths): linear scales, round tick values, paths.

export interface Box {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
}

export interface XY {
  x: number;
  y: number;
}

/** Round tick values covering [lo, hi]: steps of 1, 2 or 5 × 10ⁿ, about `count` intervals. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [];
  if (hi === lo) {
    hi = lo + 1;
    lo = lo - 1;
  }
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  // The 1-2-5 step nearest the raw one (on a log scale), so the count stays close to the one asked.
  const step = [1, 2, 5, 10].map((m) => m * mag).reduce((b, s) => (Math.abs(Math.log(s / raw)) < Math.abs(Math.log(b / raw)) ? s : b));
  const first = Math.floor(lo / step) * step;
  const out: number[] = [];
  for (let v = first; v <= hi + step * 1e-9; v += step) out.push(Number((Math.round(v / step) * step).toPrecision(12)));
  if (out[out.length - 1] < hi - step * 1e-9) out.push(Number((out[out.length - 1] + step).toPrecision(12)));
  return out.map((v) => (Math.abs(v) < step * 1e-9 ? 0 : v));
}

export interface Scale {
  (v: number): number;
  domain: [number, number];
  ticks: number[];
}

export function linear(domain: [number, number], range: [number, number], tickCount = 5): Scale {
  const ticks = niceTicks(domain[0], domain[1], tickCount);
  const d0 = Math.min(domain[0], ticks[0] ?? domain[0]);
  const d1 = Math.max(domain[1], ticks[ticks.length - 1] ?? domain[1]);
  const span = d1 - d0 || 1;
  const f = ((v: number) => range[0] + ((v - d0) / span) * (range[1] - range[0])) as Scale;
  f.domain = [d0, d1];
  f.ticks = ticks;
  return f;
}

/** An SVG path through the points, broken where a point is not finite. */
export function linePath(points: XY[]): string {
  let d = "";
  let pen = false;
  for (const p of points) {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) {
      pen = false;
      continue;
    }
    d += `${pen ? "L" : "M"}${p.x.toFixed(2)} ${p.y.toFixed(2)} `;
    pen = true;
  }
  return d.trim();
}

/** Keep at most `max` points, evenly spaced, always keeping the first and last. */
export function thin<T>(points: T[], max: number): T[] {
  if (points.length <= max) return points;
  const out: T[] = [];
  const step = (points.length - 1) / (max - 1);
  for (let i = 0; i < max; i++) out.push(points[Math.round(i * step)]);
  return out;
}

/** Tick labels without needless decimals: "−20", "0", "2.5". */
export function tickLabel(v: number, ticks: number[]): string {
  const step = ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : 1;
  const digits = step >= 1 ? 0 : Math.min(3, Math.ceil(-Math.log10(step)));
  return v.toFixed(digits).replace("-", "−");
}

export interface PlacedLabel {
  /** Left edge of the text. */
  x0: number;
  x1: number;
  row: number;
  anchor: "start" | "end";
}

// IBM Plex Sans' average advance is a little over half an em (from memory); 0.6 em errs wide, so
// two labels judged apart are apart.
const EM_PER_CHAR = 0.6;

/**
 * Event labels in rows so that none overlaps another, however close the events: sorted by
 * position, each label takes the first row where it clears every label already there by `gap`;
 * a label that would run past `right` is drawn to the left of its line instead. Returned in the
 * order given.
 */
export function placeEventLabels(items: { x: number; text: string }[], o: { fontSize: number; right: number; pad?: number; gap?: number }): PlacedLabel[] {
  const pad = o.pad ?? 1.5;
  const gap = o.gap ?? 2;
  const rows: { x0: number; x1: number }[][] = [];
  const out: PlacedLabel[] = new Array(items.length);
  const order = items.map((it, i) => ({ ...it, i })).sort((a, b) => a.x - b.x);
  for (const it of order) {
    const w = it.text.length * o.fontSize * EM_PER_CHAR;
    const anchor = it.x + pad + w > o.right ? "end" : "start";
    const x0 = anchor === "start" ? it.x + pad : it.x - pad - w;
    const x1 = x0 + w;
    let row = rows.findIndex((r) => r.every((b) => x1 + gap <= b.x0 || x0 >= b.x1 + gap));
    if (row < 0) row = rows.push([]) - 1;
    rows[row].push({ x0, x1 });
    out[it.i] = { x0, x1, row, anchor };
  }
  return out;
}
