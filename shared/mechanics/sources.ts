import type { CalibrationMap } from "./calibration";
import { MechanicsInputError } from "./errors";
import { lowerBound, type WorldTrack } from "./track-smoothing";
import type { ImageTrack } from "./validate-shot";

// A smoothed "source" is one landmark, or the mean of two (the blade midpoint from heel and toe),
// taken to world millimetres — with digitising noise added in the Monte Carlo trials.

export type SourceKey = "puck" | "blade" | "bladeHeel" | "bottomHand" | "topHand";
export type BladePoint = "midpoint" | "heel" | "toe";

export interface Source {
  key: SourceKey;
  /** Tracks with identical frames; the source is their mean in world coordinates. */
  parts: ImageTrack[];
  /** Document track names, for messages. */
  names: string[];
}

export interface Noise {
  normal: () => number;
  sigmaPx: number;
}

function sameFrames(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function pick(t: ImageTrack, idx: number[]): ImageTrack {
  const n = idx.length;
  const out: ImageTrack = { frames: new Int32Array(n), x: new Float64Array(n), y: new Float64Array(n) };
  for (let k = 0; k < n; k++) {
    out.frames[k] = t.frames[idx[k]];
    out.x[k] = t.x[idx[k]];
    out.y[k] = t.y[idx[k]];
  }
  return out;
}

/** The two tracks cut down to the frames both have. */
function common(a: ImageTrack, b: ImageTrack): [ImageTrack, ImageTrack] {
  if (sameFrames(a.frames, b.frames)) return [a, b];
  const fa: number[] = [];
  const fb: number[] = [];
  for (let i = 0, j = 0; i < a.frames.length && j < b.frames.length; ) {
    if (a.frames[i] === b.frames[j]) {
      fa.push(i++);
      fb.push(j++);
    } else if (a.frames[i] < b.frames[j]) i++;
    else j++;
  }
  return [pick(a, fa), pick(b, fb)];
}

function marksUpTo(t: ImageTrack, frame: number): number {
  let n = 0;
  while (n < t.frames.length && t.frames[n] <= frame) n++;
  return n;
}

/**
 * The blade point: mean of heel and toe where both are marked, else whichever is marked —
 * judged by the marks up to puck strike, which the blade speed needs (at least 3).
 */
export function bladeSource(heel: ImageTrack | undefined, toe: ImageTrack | undefined, puckStrike: number): { source: Source; point: BladePoint } | null {
  const options: { source: Source; point: BladePoint }[] = [];
  if (heel && toe) options.push({ source: { key: "blade", parts: common(heel, toe), names: ["bladeHeel", "bladeToe"] }, point: "midpoint" });
  if (heel) options.push({ source: { key: "blade", parts: [heel], names: ["bladeHeel"] }, point: "heel" });
  if (toe) options.push({ source: { key: "blade", parts: [toe], names: ["bladeToe"] }, point: "toe" });
  const usable = options.filter((o) => o.source.parts[0].frames.length > 0);
  if (usable.length === 0) return null;
  return usable.find((o) => marksUpTo(o.source.parts[0], puckStrike) >= 3) ?? usable.reduce((a, b) => (b.source.parts[0].frames.length > a.source.parts[0].frames.length ? b : a));
}

/** World track of the source's marks with lo ≤ frame ≤ hi (at most `limit` of them). */
export function worldTrack(src: Source, cal: CalibrationMap, lo = -Infinity, hi = Infinity, noise?: Noise, limit = Infinity): WorldTrack {
  const ref = src.parts[0].frames;
  const i0 = lowerBound(ref, lo);
  const i1 = Math.min(lowerBound(ref, hi + 1), i0 + limit);
  const n = Math.max(0, i1 - i0);
  // The frames are a view: tracks are never written to once parsed.
  const out: WorldTrack = { frames: ref.subarray(i0, i0 + n), x: new Float64Array(n), y: new Float64Array(n) };
  const k = 1 / src.parts.length;
  const aff = cal.affine;
  const checkFront = cal.type === "plane" && !noise;
  for (const part of src.parts) {
    for (let i = 0; i < n; i++) {
      let px = part.x[i0 + i];
      let py = part.y[i0 + i];
      if (noise) {
        px += noise.sigmaPx * noise.normal();
        py += noise.sigmaPx * noise.normal();
      }
      if (checkFront && !cal.inFront([px, py]))
        throw new MechanicsInputError(["tracks", src.names[src.parts.indexOf(part)]], `the mark at frame ${ref[i0 + i]} lies beyond the calibration plane's horizon`);
      if (aff) {
        out.x[i] += k * (aff.M[0] * px + aff.M[1] * py + aff.t[0]);
        out.y[i] += k * (aff.M[2] * px + aff.M[3] * py + aff.t[1]);
      } else {
        const [X, Y] = cal.toWorld([px, py]);
        out.x[i] += k * X;
        out.y[i] += k * Y;
      }
    }
  }
  return out;
}
