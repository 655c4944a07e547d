import type { Mark } from "@shared/schemas/shots";

// One landmark's marks, kept sorted by frame and never mutated: an edit returns a new array, so
// undo snapshots share everything they did not change.

/** Index of the first mark at or after `frame`. */
export function lowerBound(track: readonly Mark[], frame: number): number {
  let lo = 0;
  let hi = track.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (track[mid][0] < frame) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export function markAt(track: readonly Mark[] | undefined, frame: number): Mark | null {
  if (!track) return null;
  const i = lowerBound(track, frame);
  return i < track.length && track[i][0] === frame ? track[i] : null;
}

export function withMark(track: readonly Mark[] | undefined, frame: number, x: number, y: number): Mark[] {
  const t = track ?? [];
  const i = lowerBound(t, frame);
  const m: Mark = [frame, x, y];
  if (i < t.length && t[i][0] === frame) return [...t.slice(0, i), m, ...t.slice(i + 1)];
  return [...t.slice(0, i), m, ...t.slice(i)];
}

export function withoutMark(track: readonly Mark[] | undefined, frame: number): Mark[] {
  const t = track ?? [];
  const i = lowerBound(t, frame);
  return i < t.length && t[i][0] === frame ? [...t.slice(0, i), ...t.slice(i + 1)] : [...t];
}

/** Up to `n` marks before `frame` (oldest first), for the trail. */
export function trailBefore(track: readonly Mark[] | undefined, frame: number, n: number): Mark[] {
  if (!track || n <= 0) return [];
  const i = lowerBound(track, frame);
  return track.slice(Math.max(0, i - n), i);
}

/** The nearest marked frame before / after `frame`, or null. */
export function neighbourFrame(track: readonly Mark[] | undefined, frame: number, dir: -1 | 1): number | null {
  if (!track?.length) return null;
  const i = lowerBound(track, frame);
  if (dir < 0) return i > 0 ? track[i - 1][0] : null;
  const j = i < track.length && track[i][0] === frame ? i + 1 : i;
  return j < track.length ? track[j][0] : null;
}

/** Sorted copy (marks from the server or local storage may come in any order). */
export const sortedTrack = (t: readonly Mark[]) => [...t].sort((a, b) => a[0] - b[0]);
