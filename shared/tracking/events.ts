// The four events proposed from the tracks, each with how sure it is and what it rests on, for
// the analyst to confirm or move (nothing is set silently):
//   ice strike  — the blade stops coming down (a kink in its height), the shaft starting to bend
//   puck strike — the puck, still until then, starts to move
//   peak bend   — the largest bend angle (a parabola through the top of the bend curve)
//   release     — the puck leaves the blade: the gap between toe and puck starts to open
// Image pixels, y down; frames as the clip numbers them.
import { bendAngleDeg } from "../mechanics/bend";
import type { Landmark, Mark } from "../schemas/shot-document";
import { Matrix, inverse } from "ml-matrix";
import { changeConfidence, findChange, type Series } from "./change-point";

export type EventKey = "iceStrike" | "puckStrike" | "peakBend" | "release";

export interface EventProposal {
  frame: number;
  /** 0 … 1: how clearly the evidence puts it on this frame rather than the next one either side. */
  confidence: number;
  /** One line a coach can check against the picture. */
  evidence: string;
}

export type EventProposals = Partial<Record<EventKey, EventProposal>>;

type Tracks = Partial<Record<Landmark, Mark[]>>;

/** Frames either side of a candidate taken into a change fit. */
const REACH = 24;
/** Movement that counts as "started moving", in px, and as multiples of the still scatter. */
const MOVED_PX = 1.5;

const f1 = (v: number) => v.toFixed(1);
const f2 = (v: number) => v.toFixed(2);

function byFrame(marks: Mark[] | undefined): Map<number, [number, number]> {
  return new Map((marks ?? []).map(([f, x, y]) => [f, [x, y]]));
}

/** Frames present in every map given, ascending. */
function common(...maps: Map<number, unknown>[]): number[] {
  return [...maps[0].keys()].filter((f) => maps.every((m) => m.has(f))).sort((a, b) => a - b);
}

/** The puck starts to move: still before (constant), moving after (a quadratic from the same point). */
export function proposePuckStrike(tracks: Tracks): EventProposal | null {
  const puck = [...(tracks.puck ?? [])].sort((a, b) => a[0] - b[0]);
  if (puck.length < 6) return null;
  // The puck at rest where the track begins; the first frame it is clearly away from there.
  const rest = puck.slice(0, Math.min(5, puck.length));
  const rx = median(rest.map((m) => m[1])), ry = median(rest.map((m) => m[2]));
  const moved = puck.findIndex(([, x, y]) => Math.hypot(x - rx, y - ry) > MOVED_PX);
  if (moved < 3) return null;
  const s: Series = { frames: puck.map((m) => m[0]), values: puck.map((m) => [m[1], m[2]]) };
  const guess = puck[moved][0];
  const fit = findChange(s, { before: 0, after: 2, from: Math.max(puck[0][0] + 1, guess - 4), to: guess, window: [guess - REACH, guess + 8] });
  if (!fit) return null;
  const frame = Math.round(fit.at);
  const speed = Math.hypot(fit.slopeAfter[0], fit.slopeAfter[1]);
  return { frame, confidence: changeConfidence(fit), evidence: `the puck is still up to frame ${frame}, then moves (${f1(speed)} px a frame at first)` };
}

/** The blade stops coming down: its height (the mean of heel and toe) falls, then holds. */
export function proposeIceStrike(tracks: Tracks, before?: number): EventProposal | null {
  const heel = byFrame(tracks.bladeHeel), toe = byFrame(tracks.bladeToe);
  const parts = [heel, toe].filter((m) => m.size);
  if (!parts.length) return null;
  const frames = common(...parts).filter((f) => before === undefined || f <= before);
  if (frames.length < 8) return null;
  const height = frames.map((f) => parts.reduce((a, m) => a + m.get(f)![1], 0) / parts.length);
  // Down the picture is +y; the blade is lowest (largest y) on the ice.
  const low = Math.max(...height);
  const onIce = frames[height.findIndex((h) => h >= low - MOVED_PX)];
  const s: Series = { frames, values: height.map((h) => [h]) };
  const fit = findChange(s, { before: 2, after: 0, from: Math.max(frames[0] + 2, onIce - 6), to: Math.min(frames.at(-1)! - 2, onIce + 6), window: [onIce - REACH, onIce + REACH] });
  if (!fit) return null;
  const frame = Math.round(fit.at);
  // y grows as the blade comes down: coming down means a rising height in the picture's y just before.
  const falling = fit.slopeBefore[0];
  if (!(falling > 0)) return null;
  return { frame, confidence: changeConfidence(fit), evidence: `the blade comes down ${f2(falling)} px a frame and stops on the ice at frame ${frame}` };
}

/** The bend angle (top hand, bottom hand, blade heel) on every frame all three are tracked. */
export function bendSeries(tracks: Tracks): { frames: number[]; angles: number[] } {
  const top = byFrame(tracks.topHand), bottom = byFrame(tracks.bottomHand), heel = byFrame(tracks.bladeHeel);
  if (!top.size || !bottom.size || !heel.size) return { frames: [], angles: [] };
  const frames = common(top, bottom, heel);
  return { frames, angles: frames.map((f) => bendAngleDeg(top.get(f)!, bottom.get(f)!, heel.get(f)!)) };
}

/** The largest bend: a parabola through the frames near the top of the bend curve. */
export function proposePeakBend(tracks: Tracks, from?: number, to?: number): EventProposal | null {
  const all = bendSeries(tracks);
  const keep = all.frames.map((f, i) => i).filter((i) => (from === undefined || all.frames[i] >= from) && (to === undefined || all.frames[i] <= to));
  if (keep.length < 5) return null;
  const frames = keep.map((i) => all.frames[i]);
  const angles = keep.map((i) => all.angles[i]);
  const smooth = angles.map((_, i) => mean(angles.slice(Math.max(0, i - 2), i + 3)));
  const top = smooth.indexOf(Math.max(...smooth));
  const low = Math.min(...smooth);
  const rise = smooth[top] - low;
  if (!(rise > 0.3)) return null; // under 0.3° of bend: no peak worth proposing
  // The frames within the top fifth of the rise around the highest one.
  let a = top, b = top;
  while (a > 0 && smooth[a - 1] >= smooth[top] - 0.2 * rise) a--;
  while (b < smooth.length - 1 && smooth[b + 1] >= smooth[top] - 0.2 * rise) b++;
  // Too few frames on the top (a low frame rate): widen to two either side of it.
  if (b - a < 4) [a, b] = [Math.max(0, top - 2), Math.min(smooth.length - 1, top + 2)];
  const fit = parabola(frames.slice(a, b + 1), angles.slice(a, b + 1));
  const inside = fit && fit.curvature < 0 && fit.vertex >= frames[a] - 0.5 && fit.vertex <= frames[b] + 0.5;
  const frame = inside ? Math.round(fit!.vertex) : frames[top];
  const confidence = inside ? withinHalfFrame(fit!.vertexSe) : 0.2;
  const angle = angles[frames.indexOf(frame)] ?? smooth[top];
  return { frame, confidence, evidence: `the bend is largest at frame ${frame}, ${f1(angle)}° (top of a parabola through frames ${frames[a]}–${frames[b]})` };
}

/** The puck leaves the blade: the gap from the toe (else the puck's own path) stops holding steady. */
export function proposeRelease(tracks: Tracks, strike?: number): EventProposal | null {
  const puck = byFrame(tracks.puck), toe = byFrame(tracks.bladeToe);
  if (puck.size < 8) return null;
  const start = strike ?? Math.min(...puck.keys());
  if (toe.size) {
    const frames = common(puck, toe).filter((f) => f > start);
    if (frames.length >= 8) {
      const gap = frames.map((f) => [puck.get(f)![0] - toe.get(f)![0], puck.get(f)![1] - toe.get(f)![1]]);
      // The first frame the gap has clearly opened from what it was just after strike.
      const early = gap.slice(0, 3);
      const gx = median(early.map((g) => g[0])), gy = median(early.map((g) => g[1]));
      const open = gap.findIndex((g) => Math.hypot(g[0] - gx, g[1] - gy) > 2 * MOVED_PX);
      if (open > 2) {
        const s: Series = { frames, values: gap };
        // A short stretch after the opening: the gap grows faster than a parabola further on.
        const fit = findChange(s, { before: 1, after: 2, from: frames[Math.max(1, open - 12)], to: frames[open], window: [frames[open] - REACH, frames[open] + 3] });
        if (fit) {
          const frame = Math.round(fit.at);
          return { frame, confidence: changeConfidence(fit), evidence: `the puck rides on the toe up to frame ${frame}, then the gap opens (${f1(Math.hypot(...(fit.slopeAfter as [number, number])))} px a frame)` };
        }
      }
    }
  }
  // No toe: the puck's path bends where the blade stops pushing it (accelerating before, straight after).
  const frames = [...puck.keys()].filter((f) => f > start).sort((a, b) => a - b);
  if (frames.length < 8) return null;
  const s: Series = { frames, values: frames.map((f) => puck.get(f)!) };
  const fit = findChange(s, { before: 2, after: 1, from: frames[2], to: frames[frames.length - 3], window: [frames[0], frames[frames.length - 1]] });
  if (!fit) return null;
  const frame = Math.round(fit.at);
  return { frame, confidence: 0.5 * changeConfidence(fit), evidence: `the puck's path turns straight at frame ${frame} (no toe track to compare with)` };
}

/** All four, in order, each search limited by the ones before it. */
export function proposeEvents(tracks: Tracks): EventProposals {
  const out: EventProposals = {};
  const puckStrike = proposePuckStrike(tracks);
  if (puckStrike) out.puckStrike = puckStrike;
  const ice = proposeIceStrike(tracks, puckStrike?.frame);
  if (ice) out.iceStrike = ice;
  const release = proposeRelease(tracks, puckStrike?.frame);
  if (release) out.release = release;
  const peak = proposePeakBend(tracks, ice?.frame, release?.frame);
  if (peak) out.peakBend = peak;
  return out;
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function mean(v: number[]): number {
  return v.reduce((a, b) => a + b, 0) / v.length;
}

/**
 * Least-squares parabola y = a + b·u + c·u² (u = x − mean x): its vertex and the vertex's standard
 * error by the delta method from the fit's covariance σ²(XᵀX)⁻¹.
 */
function parabola(xs: number[], ys: number[]): { vertex: number; vertexSe: number; curvature: number } | null {
  const n = xs.length;
  if (n < 4) return null;
  const x0 = mean(xs);
  const X = new Matrix(xs.map((x) => [1, x - x0, (x - x0) ** 2]));
  const y = Matrix.columnVector(ys);
  try {
    const xtxInv = inverse(X.transpose().mmul(X));
    const beta = xtxInv.mmul(X.transpose()).mmul(y).to1DArray();
    const [, b, c] = beta;
    const resid = y.clone().sub(X.mmul(Matrix.columnVector(beta))).to1DArray();
    const s2 = resid.reduce((a, r) => a + r * r, 0) / (n - 3);
    const vertex = x0 - b / (2 * c);
    // ∂v/∂b = −1/(2c), ∂v/∂c = b/(2c²)
    const g = [0, -1 / (2 * c), b / (2 * c * c)];
    let v = 0;
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) v += g[i] * g[j] * xtxInv.get(i, j) * s2;
    return { vertex, vertexSe: Math.sqrt(Math.max(v, 0)), curvature: c };
  } catch {
    return null;
  }
}

/** P(|N(0, se)| < 0.5): the chance the true frame rounds to the one proposed. */
function withinHalfFrame(se: number): number {
  if (!(se > 0)) return 1;
  return erf(0.5 / (se * Math.SQRT2));
}

/** Abramowitz & Stegun 7.1.26 (|error| < 1.5e-7). */
function erf(x: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(x));
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x);
  return x >= 0 ? y : -y;
}
