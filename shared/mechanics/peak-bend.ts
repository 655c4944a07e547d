import { bendAngleDeg, bendAngleXY, chordGeometry, type ChordGeometry } from "./bend";
import { endPadLength, zeroLagDesignCached, zeroLagLowPassPair } from "./butterworth";
import type { CalibrationMap } from "./calibration";
import type { Vec2 } from "./homography";
import { linearState } from "./linear-response";
import type { Source } from "./sources";
import { gridIndex, type SmoothSegment } from "./track-smoothing";

// The stick's bend frame by frame from the smoothed top hand, bottom hand and blade heel, its peak
// between ice strike and release, and the three landmark states there for the Monte Carlo trials.
// The peak frame is the largest bend of the marks smoothed twice over: on the once-smoothed bend the
// largest value is partly the frame where the digitising noise happened to add most, which biases
// the peak upwards; the twice-smoothed bend follows the motion. The value is read on that frame from
// the once-smoothed marks.

export interface SmoothedSource {
  src: Source;
  cutoffHz: number | null;
  segments: SmoothSegment[];
}

interface Located {
  g: SmoothSegment;
  i: number;
}

export interface BendPoint {
  frame: number;
  angle: number;
  at: [Located, Located, Located];
}

export interface BendShape {
  angleDeg: number;
  geometry: ChordGeometry;
}

/** The smoothed piece and grid index holding a marked frame of the source. */
function markedAt(s: SmoothedSource, frame: number): Located | null {
  for (const g of s.segments) {
    const i = gridIndex(g, frame);
    if (i >= 0 && g.marked[i]) return { g, i };
  }
  return null;
}

/** Grid index of a marked frame on a smoothed piece, or −1. */
function markedIndex(g: SmoothSegment, frame: number): number {
  const i = gridIndex(g, frame);
  return i >= 0 && g.marked[i] ? i : -1;
}

/** Bend at every frame where all three landmarks are marked (for the chart), as two columns (no object per frame). */
export function bendSeries(top: SmoothedSource, bottom: SmoothedSource, heel: SmoothedSource): { frames: number[]; angles: number[] } {
  const out = { frames: [] as number[], angles: [] as number[] };
  // The pieces are in frame order, so the one holding a frame is found by walking forward.
  let pt = 0;
  let pb = 0;
  for (const H of heel.segments)
    for (let i = 0; i < H.frames.length; i++) {
      if (!H.marked[i]) continue;
      const f = H.frames[i];
      while (pt < top.segments.length - 1 && top.segments[pt].frames[top.segments[pt].frames.length - 1] < f) pt++;
      while (pb < bottom.segments.length - 1 && bottom.segments[pb].frames[bottom.segments[pb].frames.length - 1] < f) pb++;
      const T = top.segments[pt];
      const B = bottom.segments[pb];
      const it = T ? markedIndex(T, f) : -1;
      const ib = B ? markedIndex(B, f) : -1;
      if (it >= 0 && ib >= 0) {
        out.frames.push(f);
        out.angles.push(bendAngleXY(T.sx[it], T.sy[it], B.sx[ib], B.sy[ib], H.sx[i], H.sy[i]));
      }
    }
  return out;
}

/** Samples beyond which two passes of the filter at the piece's cutoff no longer reach (twice its padding). */
function reachOf(g: SmoothSegment): number {
  return g.cutoffHz === null || g.x.length < 3 ? 0 : 2 * endPadLength(zeroLagDesignCached(g.cutoffHz, g.fsHz)) + 2;
}

/** Smoothed positions of samples a … b of a piece, smoothed once more (on a window wide enough for the filter). */
function twiceOver(g: SmoothSegment, a: number, b: number): { at: (i: number) => Vec2 } {
  if (g.cutoffHz === null || g.x.length < 3) return { at: (i) => [g.sx[i], g.sy[i]] };
  const r = reachOf(g);
  const lo = Math.max(0, a - r);
  const hi = Math.min(g.x.length, b + r + 1);
  const [sx, sy] = zeroLagLowPassPair(g.sx.subarray(lo, hi), g.sy.subarray(lo, hi), g.cutoffHz, g.fsHz);
  return { at: (i) => [sx[i - lo], sy[i - lo]] };
}

/** The peak between frames `from` and `to`, judged on the twice-smoothed bend; null when no frame there has all three landmarks. */
export function findPeak(top: SmoothedSource, bottom: SmoothedSource, heel: SmoothedSource, from: number, to: number): BendPoint | null {
  const frames: number[] = [];
  const located: [Located, Located, Located][] = [];
  for (const H of heel.segments)
    for (let i = 0; i < H.frames.length; i++) {
      const f = H.frames[i];
      if (f < from || f > to || !H.marked[i]) continue;
      const T = markedAt(top, f);
      const B = markedAt(bottom, f);
      if (T && B) {
        frames.push(f);
        located.push([T, B, { g: H, i }]);
      }
    }
  if (!frames.length) return null;
  // One twice-smoothed window per piece, over the candidate samples.
  const windows = new Map<SmoothSegment, { at: (i: number) => Vec2 }>();
  const span = new Map<SmoothSegment, [number, number]>();
  for (const trio of located)
    for (const { g, i } of trio) {
      const s = span.get(g);
      span.set(g, s ? [Math.min(s[0], i), Math.max(s[1], i)] : [i, i]);
    }
  for (const [g, [a, b]] of span) windows.set(g, twiceOver(g, a, b));
  let best = -1;
  let bestAngle = -Infinity;
  located.forEach((trio, k) => {
    const [t, b, h] = trio.map(({ g, i }) => windows.get(g)!.at(i));
    const a = bendAngleDeg(t, b, h);
    if (a > bestAngle) {
      bestAngle = a;
      best = k;
    }
  });
  const at = located[best];
  return { frame: frames[best], angle: bendAngleDeg(...(at.map(({ g, i }) => [g.sx[i], g.sy[i]] as Vec2) as [Vec2, Vec2, Vec2])), at };
}

export const shapeOf = (pts: Vec2[]): BendShape => ({ angleDeg: bendAngleDeg(pts[0], pts[1], pts[2]), geometry: chordGeometry(pts[0], pts[1], pts[2]) });

export interface PeakBend {
  point: BendPoint;
  nominal: BendShape;
  /** The shape from the marks smoothed twice over: its difference from `nominal` estimates the smoothing's flattening. */
  twice: BendShape;
  /** One trial: calibration and digitising noise. */
  sample(cal: CalibrationMap, normal: () => number): BendShape;
}

/** The peak's states as linear functions of the marks, and the twice-smoothed shape there. */
export function peakBend(peak: BendPoint, sources: [SmoothedSource, SmoothedSource, SmoothedSource], cal: CalibrationMap, sigmaPx: number): PeakBend {
  const states = sources.map((s, k) => linearState(s.src, peak.at[k].g, peak.at[k].i, cal, sigmaPx));
  return {
    point: peak,
    nominal: shapeOf(states.map((st) => [st.nominal.x, st.nominal.y] as Vec2)),
    twice: shapeOf(peak.at.map(({ g, i }) => twiceOver(g, i, i).at(i))),
    sample: (c, normal) =>
      shapeOf(
        states.map((st) => {
          const v = st.sample(c, normal);
          return [v.x, v.y] as Vec2;
        }),
      ),
  };
}
