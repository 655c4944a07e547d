import { maxWantedCutoff } from "./butterworth";
import { MechanicsInputError } from "./errors";
import { residualAnalysisCutoff, type ResidualSeries } from "./residual-analysis";
import type { SourceKey } from "./sources";
import type { TimeBase } from "./time-base";
import { gridSegments, type GridSegment, type PieceLabel, type WorldTrack } from "./track-smoothing";

// Per-source smoothing: where the track is cut and which cutoff it gets.

export type CutoffMode = "auto" | "raw" | number;

export interface Cuts {
  splits: number[];
  labels: PieceLabel[];
}

/** The stick's landmarks, smoothed together for the shaft's shape. */
export const STICK_KEYS = ["bladeHeel", "bottomHand", "topHand"] as const;
export type StickKey = (typeof STICK_KEYS)[number];
export const isStickKey = (k: SourceKey): k is StickKey => (STICK_KEYS as readonly string[]).includes(k);

/**
 * Where each source's track is cut (Gonzalez & Knudson, ISBS 2019: never filter through an impact
 * whose speed change you measure). The puck is cut at puck strike and release, the blade at puck
 * strike. The stick's landmarks are not cut: the shaft's shape is continuous through the impact,
 * and with one filter for all three the rigid motion that does jump there cancels in the shape
 * (a linear filter of a difference is the difference of the filtered tracks).
 */
export function cutsFor(key: SourceKey, puckStrike: number, release: number): Cuts {
  if (key === "puck") return { splits: [puckStrike, release], labels: ["beforeStrike", "contact", "afterRelease"] };
  if (key === "blade") return { splits: [puckStrike], labels: ["beforeStrike", "afterStrike"] };
  return { splits: [], labels: ["whole"] };
}

/** Residual analysis looks at most at this many samples per piece, those nearest the window's centre. */
export const RESIDUAL_CAP = 1024;

/** Frames [from, to] whose motion a result is measured from: residual analysis looks only there. */
export type FrameWindow = [number, number];

function residualSeries(grids: GridSegment[], window: FrameWindow): ResidualSeries[] {
  const out: ResidualSeries[] = [];
  const centre = (window[0] + window[1]) / 2;
  for (const g of grids) {
    const n = g.x.length;
    let a = Math.max(0, Math.ceil((window[0] - g.frames[0]) / g.step));
    let b = Math.min(n, Math.floor((window[1] - g.frames[0]) / g.step) + 1);
    if (b - a > RESIDUAL_CAP) {
      const at = Math.round((centre - g.frames[0]) / g.step);
      a = Math.min(b - RESIDUAL_CAP, Math.max(a, at - RESIDUAL_CAP / 2));
      b = a + RESIDUAL_CAP;
    }
    if (b > a) out.push({ fsHz: g.fsHz, values: g.x.subarray(a, b) }, { fsHz: g.fsHz, values: g.y.subarray(a, b) });
  }
  return out;
}

/**
 * The shaft's shape over the frames where every given stick landmark is marked: each landmark
 * relative to the first (for one landmark, its own track). This is what the bend is measured from,
 * so its residual analysis sets the stick's cutoff.
 */
export function shapeTracks(tracks: WorldTrack[]): WorldTrack[] {
  if (tracks.length === 1) return tracks;
  const [ref, ...rest] = tracks;
  // Rows where every landmark is marked: the reference's index and each other track's (no object per frame).
  const n = ref.frames.length;
  const refAt = new Int32Array(n);
  const restAt = rest.map(() => new Int32Array(n));
  const at = rest.map(() => 0);
  let rows = 0;
  for (let i = 0; i < n; i++) {
    const f = ref.frames[i];
    let all = true;
    for (let k = 0; k < rest.length; k++) {
      const t = rest[k];
      while (at[k] < t.frames.length && t.frames[at[k]] < f) at[k]++;
      if (at[k] < t.frames.length && t.frames[at[k]] === f) restAt[k][rows] = at[k];
      else all = false;
    }
    if (all) refAt[rows++] = i;
  }
  const frames = Int32Array.from(refAt.subarray(0, rows), (i) => ref.frames[i]);
  return rest.map((t, k) => ({
    frames,
    x: Float64Array.from(refAt.subarray(0, rows), (i, r) => t.x[restAt[k][r]] - ref.x[i]),
    y: Float64Array.from(refAt.subarray(0, rows), (i, r) => t.y[restAt[k][r]] - ref.y[i]),
  }));
}

export function cutoffFromTracks(tracks: WorldTrack[], cuts: Cuts, captureFps: number, time: TimeBase, window: FrameWindow, mode: CutoffMode, name: string) {
  const grids = tracks.flatMap((t) => gridSegments(t, cuts.splits, cuts.labels, captureFps, undefined, time));
  return chooseCutoff(grids, mode, name, window);
}

/** Cutoff for one source: analyst's (checked against each segment's Nyquist rate), residual analysis, or raw. */
export function chooseCutoff(grids: GridSegment[], mode: CutoffMode, name: string, window: FrameWindow): { cutoffHz: number | null; tooFew: boolean } {
  if (mode === "raw") return { cutoffHz: null, tooFew: false };
  if (typeof mode === "number") {
    for (const g of grids) {
      const max = maxWantedCutoff(g.fsHz);
      if (g.x.length >= 3 && mode > max)
        throw new MechanicsInputError(
          ["cutoffHz"],
          `${mode} Hz is too high for ${name} marked ${g.step > 1 ? `every ${g.step} frames` : "on every frame"} (${g.fsHz} Hz): use at most ${max.toFixed(1)} Hz`,
        );
    }
    return { cutoffHz: mode, tooFew: false };
  }
  const choice = residualAnalysisCutoff(residualSeries(grids, window));
  return choice ? { cutoffHz: choice.cutoffHz, tooFew: false } : { cutoffHz: null, tooFew: true };
}
