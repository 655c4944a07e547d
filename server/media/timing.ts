// A clip's frame clock from its presentation times. Containers round times to their own clock
// (a QuickTime 600 time scale gives 240 fps frames 3.33/5.00 ms apart; Matroska keeps whole
// milliseconds, so 1,200 fps frames repeat times): when every frame sits within one clock tick of
// a regular grid, the times are put on that grid. Only what the clock cannot explain stays: gaps
// (frames missing) and repeats (two frames in one slot), or a clock that is uneven throughout.
import type { ClipTiming } from "../../shared/schemas/clips";

export interface TimingResult {
  /** Seconds from frame 1, snapped onto the grid when the clock allows. */
  times: number[];
  timing: ClipTiming;
}

/** Lists of gaps and repeats kept with the clip are cut here; the counts stay exact. */
const MAX_LISTED = 200;
const round6 = (s: number) => Math.round(s * 1e6) / 1e6;

interface GridFit {
  d: number;
  slots: number[];
  /** Half the spread of the residuals: how far the worst frame is from the grid. */
  halfSpread: number;
  irregular: number;
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  return s.length ? s[Math.floor(s.length / 2)] : NaN;
}

/** Frames on the grid k·d + φ (slots from stepSlots): how far off the grid the worst frame is. */
function fitGrid(t: number[], d: number, tick: number): GridFit {
  const slots = stepSlots(t, d, tick);
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < t.length; i++) {
    const e = t[i] - slots[i] * d;
    lo = Math.min(lo, e);
    hi = Math.max(hi, e);
  }
  let irregular = 0;
  for (let i = 1; i < slots.length; i++) if (slots[i] - slots[i - 1] !== 1) irregular++;
  return { d, slots, halfSpread: (hi - lo) / 2, irregular };
}

/** Least-squares frame interval through (slot, time). */
function refine(t: number[], slots: number[]): number {
  const n = t.length;
  let sk = 0;
  let st = 0;
  for (let i = 0; i < n; i++) {
    sk += slots[i];
    st += t[i];
  }
  const mk = sk / n;
  const mt = st / n;
  let num = 0;
  let den = 0;
  for (let i = 0; i < n; i++) {
    num += (slots[i] - mk) * (t[i] - mt);
    den += (slots[i] - mk) ** 2;
  }
  return den > 0 ? num / den : NaN;
}

/**
 * The frame interval a clock of resolution `tick` suggests: the median slope over windows long
 * enough (≥ 20 ticks) for rounding to matter little. Windows holding a gap are outvoted.
 */
function robustInterval(t: number[], tick: number): number {
  const deltas = t.slice(1).map((v, i) => v - t[i]);
  const typical = Math.max(median(deltas), tick / 4, 1e-9);
  const w = Math.min(t.length - 1, Math.max(1, Math.ceil((20 * tick) / typical)));
  const slopes: number[] = [];
  const stride = Math.max(1, Math.floor((t.length - w) / 2000));
  for (let i = 0; i + w < t.length; i += stride) slopes.push((t[i + w] - t[i]) / w);
  return median(slopes);
}

/**
 * Slots counting every step as one frame unless it is clearly longer (a gap) or clearly none (a
 * repeat, only tellable on a clock finer than half a frame): what rounding cannot fake.
 */
function stepSlots(t: number[], d: number, tick: number): number[] {
  const slots = [0];
  for (let i = 1; i < t.length; i++) {
    const step = t[i] - t[i - 1];
    const k = step < 0.5 * d - tick ? 0 : step <= 1.5 * d + tick ? 1 : Math.round(step / d);
    slots.push(slots[i - 1] + k);
  }
  return slots;
}

/** Rates worth trying for interval d: as found, the whole number, and the 1000/1001 ("29.97") family. */
function niceRates(d: number): number[] {
  const r = 1 / d;
  return [Math.round(r), Math.round(r * 1.001) / 1.001, r].filter((x) => Number.isFinite(x) && x > 0);
}

function emptyTiming(nominalFps: number, tickS: number): ClipTiming {
  return { clock: "even", nominalFps, tickS, gaps: [], gapCount: 0, repeats: [], repeatCount: 0, missingTail: null };
}

/**
 * @param seconds presentation times from frame 1, sorted (as frameTimesFromPackets gives them)
 * @param tickS the container's clock resolution (its time base), seconds
 * @param hints rates the container states (nominal, average), tried first
 */
export function analyseTiming(seconds: number[], tickS: number, hints: (number | null | undefined)[] = []): TimingResult {
  const n = seconds.length;
  const hinted = hints.filter((h): h is number => typeof h === "number" && Number.isFinite(h) && h > 0);
  if (n < 3) {
    const fps = hinted[0] ?? (n === 2 && seconds[1] > 0 ? 1 / seconds[1] : 30);
    return { times: seconds.map((_, i) => round6(i / fps)), timing: emptyTiming(fps, tickS) };
  }
  // Times are stored to 1 µs; a clock rounds (or truncates) by up to one tick.
  const tol = Math.max(tickS, 1e-6) + 1.5e-6;
  const estimate = robustInterval(seconds, tickS);
  const candidates: number[] = [...hinted];
  // Least squares over the whole clip pins the interval far below one tick.
  let ls = estimate;
  for (let i = 0; i < 3 && Number.isFinite(ls) && ls > 0; i++) ls = refine(seconds, stepSlots(seconds, ls, tickS));
  for (const d of [ls, estimate]) if (Number.isFinite(d) && d > 0) candidates.push(...niceRates(d));

  let best: GridFit | null = null;
  for (const rate of candidates) {
    const d = 1 / rate;
    // A grid far off the frames' own spacing (a stated rate that is not the clock's) is no candidate.
    if (Math.abs(d - estimate) > 0.25 * estimate) continue;
    const fit = fitGrid(seconds, d, tickS);
    if (fit.halfSpread > tol) continue;
    if (!best || fit.irregular < best.irregular) best = fit;
  }

  if (best) {
    const k0 = best.slots[0];
    const times = best.slots.map((k) => round6((k - k0) * best.d));
    const exact = seconds.every((s, i) => Math.abs(s - times[i]) <= 1.5e-6);
    return { times, timing: irregularities(times, best.d, exact ? "even" : "snapped", tickS) };
  }
  // The clock is finer than the unevenness: the times are real and kept as they are.
  return { times: [...seconds], timing: irregularities(seconds, median(seconds.slice(1).map((v, i) => v - seconds[i])), "uneven", tickS) };
}

/** Gaps (a step of 1.5 intervals or more) and repeats (0.5 or less) of times on interval d. */
function irregularities(times: number[], d: number, clock: ClipTiming["clock"], tickS: number): ClipTiming {
  const timing = emptyTiming(1 / d, tickS);
  timing.clock = clock;
  for (let i = 1; i < times.length; i++) {
    const steps = (times[i] - times[i - 1]) / d;
    if (steps >= 1.5) {
      timing.gapCount++;
      if (timing.gaps.length < MAX_LISTED) timing.gaps.push({ after: i, missing: Math.max(1, Math.round(steps) - 1) });
    } else if (steps <= 0.5) {
      timing.repeatCount++;
      if (timing.repeats.length < MAX_LISTED) timing.repeats.push(i + 1);
    }
  }
  return timing;
}
