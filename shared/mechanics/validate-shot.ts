import { LANDMARKS, markProblem, ShotDocument, ShotDocumentMarksUnchecked, TRACK_NOT_A_LIST, type Landmark, type Mark } from "../schemas/shot-document";
import { checkCalibration } from "./calibration";
import { MechanicsInputError, type InputPath } from "./errors";
import { clockTimeBase, rateTimeBase, type TimeBase } from "./time-base";

// Everything that makes a document unusable is caught here, before any result is computed.

/** One landmark's image marks, sorted by frame. */
export interface ImageTrack {
  frames: Int32Array;
  x: Float64Array;
  y: Float64Array;
}

export interface ParsedShot {
  doc: ShotDocument;
  tracks: Partial<Record<Landmark, ImageTrack>>;
  /** Inclusive frame limits of the clip, when known. */
  clip: [number, number] | null;
  /** When each frame was captured. */
  time: TimeBase;
}

export const MIN_FLIGHT_MARKS = 3;

function clipOf(doc: ShotDocument): [number, number] | null {
  let lo = 0;
  let hi = Infinity;
  let known = false;
  if (doc.frameRange) {
    if (doc.frameRange[0] > doc.frameRange[1])
      throw new MechanicsInputError(["frameRange"], `the first frame (${doc.frameRange[0]}) is after the last (${doc.frameRange[1]})`);
    [lo, hi] = doc.frameRange;
    known = true;
  }
  if (doc.frameCount !== undefined) {
    hi = Math.min(hi, doc.frameCount - 1);
    known = true;
    if (lo > hi) throw new MechanicsInputError(["frameCount"], `frameRange starts at ${lo} but the clip has only ${doc.frameCount} frames`);
  }
  return known ? [lo, hi] : null;
}

function outside(clip: [number, number] | null, f: number): boolean {
  return clip !== null && (f < clip[0] || f > clip[1]);
}

function clipText(clip: [number, number]): string {
  return `frames ${clip[0]}–${clip[1]}`;
}

function checkEvents(doc: ShotDocument, clip: [number, number] | null): void {
  const e = doc.events;
  for (const k of ["iceStrike", "puckStrike", "peakBend", "release"] as const) {
    const f = e[k];
    if (f !== undefined && outside(clip, f)) throw new MechanicsInputError(["events", k], `frame ${f} is outside the clip (${clipText(clip!)})`);
  }
  if (e.iceStrike !== undefined && e.iceStrike > e.puckStrike)
    throw new MechanicsInputError(["events", "iceStrike"], `ice strike (frame ${e.iceStrike}) must not come after puck strike (frame ${e.puckStrike})`);
  if (e.release <= e.puckStrike)
    throw new MechanicsInputError(["events", "release"], `release (frame ${e.release}) must come after puck strike (frame ${e.puckStrike})`);
  if (e.peakBend !== undefined) {
    const from = e.iceStrike ?? -Infinity;
    if (e.peakBend < from || e.peakBend > e.release)
      throw new MechanicsInputError(
        ["events", "peakBend"],
        `peak bend (frame ${e.peakBend}) must lie between ${e.iceStrike !== undefined ? `ice strike (frame ${e.iceStrike})` : "the start"} and release (frame ${e.release})`,
      );
  }
}

/**
 * The usual case in one pass: every mark well formed and in frame order, copied as it is checked.
 * Null for anything else (the careful paths below then name the first problem).
 */
function copyInOrder(marks: unknown): ImageTrack | null {
  if (!Array.isArray(marks)) return null;
  const n = marks.length;
  const t: ImageTrack = { frames: new Int32Array(n), x: new Float64Array(n), y: new Float64Array(n) };
  let last = -1;
  for (let k = 0; k < n; k++) {
    const m: unknown = marks[k];
    if (!Array.isArray(m) || m.length !== 3) return null;
    const f: unknown = m[0];
    const x: unknown = m[1];
    const y: unknown = m[2];
    if (typeof f !== "number" || !Number.isInteger(f) || f <= last || typeof x !== "number" || !Number.isFinite(x) || typeof y !== "number" || !Number.isFinite(y))
      return null;
    t.frames[k] = f;
    t.x[k] = x;
    t.y[k] = y;
    last = f;
  }
  return t;
}

/** The first malformed mark in any track, as ShotDocument's own check names it. */
function checkMarks(tracks: Record<string, unknown>): void {
  for (const name of LANDMARKS) {
    const marks = tracks[name];
    if (marks === undefined) continue;
    if (!Array.isArray(marks)) throw new MechanicsInputError(["tracks", name], TRACK_NOT_A_LIST);
    for (let i = 0; i < marks.length; i++) {
      const problem = markProblem(marks[i], i);
      if (problem) throw new MechanicsInputError(["tracks", name, ...problem.path], problem.message);
    }
  }
}

/** Well-formed marks in any order (checkMarks found no problem): sorted, each inside the clip and once, naming the first problem in frame order. */
function sortedTrack(marks: Mark[], name: Landmark, clip: [number, number] | null): ImageTrack {
  let sorted = true;
  for (let i = 1; i < marks.length && sorted; i++) sorted = marks[i][0] > marks[i - 1][0];
  const order = sorted ? null : marks.map((_, i) => i).sort((a, b) => marks[a][0] - marks[b][0]);
  const n = marks.length;
  const t: ImageTrack = { frames: new Int32Array(n), x: new Float64Array(n), y: new Float64Array(n) };
  for (let k = 0; k < n; k++) {
    const i = order ? order[k] : k;
    const m = marks[i];
    const f = m[0];
    if (outside(clip, f)) throw new MechanicsInputError(["tracks", name, i], `frame ${f} is outside the clip (${clipText(clip!)})`);
    if (k > 0 && f === t.frames[k - 1]) throw new MechanicsInputError(["tracks", name, i], `frame ${f} is marked twice for ${name}`);
    t.frames[k] = f;
    t.x[k] = m[1];
    t.y[k] = m[2];
  }
  return t;
}

/** Parse and check a shot document; throws MechanicsInputError naming the first problem. */
export function parseShotDocument(input: unknown): ParsedShot {
  // Everything but the marks through the schema, the marks checked as they are copied (one pass
  // over up to 100,000 marks a track). Problems are named in ShotDocument's order: the schema's
  // first issue (a malformed mark comes before the events and the fields after them), then the
  // calibration, the clip and the events, then the marks' order, clip and repeats.
  const parsed = ShotDocumentMarksUnchecked.safeParse(input);
  if (!parsed.success) {
    const iss = (ShotDocument.safeParse(input).error ?? parsed.error).issues[0];
    throw new MechanicsInputError(iss.path as InputPath, iss.message);
  }
  const doc: ShotDocument = parsed.data;
  const copies = new Map<Landmark, ImageTrack | null>();
  for (const name of LANDMARKS) if (doc.tracks[name] !== undefined) copies.set(name, copyInOrder(doc.tracks[name]));
  if ([...copies.values()].includes(null)) checkMarks(doc.tracks);
  const cal = checkCalibration(doc.calibration);
  if (cal) throw new MechanicsInputError(["calibration", ...cal.path], cal.message);
  const clip = clipOf(doc);
  checkEvents(doc, clip);

  const tracks: ParsedShot["tracks"] = {};
  for (const [name, copy] of copies) {
    // In frame order, so inside the clip when its first and last marks are.
    const inClip = copy && (copy.frames.length === 0 || (!outside(clip, copy.frames[0]) && !outside(clip, copy.frames[copy.frames.length - 1])));
    tracks[name] = copy && inClip ? copy : sortedTrack(doc.tracks[name]!, name, clip);
  }
  const puck = tracks.puck!;
  let flight = 0;
  for (let i = 0; i < puck.frames.length; i++) if (puck.frames[i] >= doc.events.release) flight++;
  if (flight < MIN_FLIGHT_MARKS)
    throw new MechanicsInputError(
      ["tracks", "puck"],
      `puck exit speed needs at least ${MIN_FLIGHT_MARKS} puck marks from the release frame (${doc.events.release}) on; found ${flight}`,
    );
  return { doc, tracks, clip, time: timeBaseOf(doc, tracks, clip) };
}

/** The frames marks and events use, first and last. */
function usedFrames(doc: ShotDocument, tracks: ParsedShot["tracks"]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const f of Object.values(doc.events)) if (f !== undefined) [lo, hi] = [Math.min(lo, f), Math.max(hi, f)];
  for (const t of Object.values(tracks)) if (t && t.frames.length) [lo, hi] = [Math.min(lo, t.frames[0]), Math.max(hi, t.frames[t.frames.length - 1])];
  return [lo, hi];
}

function timeBaseOf(doc: ShotDocument, tracks: ParsedShot["tracks"], clip: [number, number] | null): TimeBase {
  if (!doc.frameTimes) return rateTimeBase(doc.captureFps);
  const [lo, hi] = usedFrames(doc, tracks);
  // Series are timed from the clip's first frame, so that one needs a time too.
  const tb = clockTimeBase(doc.frameTimes, doc.captureFps, [clip ? Math.min(lo, clip[0]) : lo, hi]);
  // Derivatives divide by time steps: a track's frames must each have their own time.
  for (const name of LANDMARKS) {
    const t = tracks[name];
    if (!t) continue;
    for (let f = t.frames[0]; f < t.frames[t.frames.length - 1]; f++)
      if (tb.t(f + 1) <= tb.t(f))
        throw new MechanicsInputError(
          ["tracks", name],
          `frames ${f} and ${f + 1} have the same capture time (the clip repeats a frame there): ${name} cannot be smoothed across them; mark only one side`,
        );
  }
  return tb;
}
