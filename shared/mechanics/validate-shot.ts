import { LANDMARKS, ShotDocument, type Landmark, type Mark } from "../schemas/shot-document";
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

function toImageTrack(marks: Mark[], name: Landmark, clip: [number, number] | null): ImageTrack {
  // Marks usually come in frame order, inside the clip, once each: copied in one pass. Anything
  // else takes the careful path below, which names the first problem in frame order.
  const n0 = marks.length;
  const fast: ImageTrack = { frames: new Int32Array(n0), x: new Float64Array(n0), y: new Float64Array(n0) };
  let k0 = 0;
  for (; k0 < n0; k0++) {
    const m = marks[k0];
    const f = m[0];
    if ((k0 > 0 && f <= fast.frames[k0 - 1]) || outside(clip, f)) break;
    fast.frames[k0] = f;
    fast.x[k0] = m[1];
    fast.y[k0] = m[2];
  }
  if (k0 === n0) return fast;
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
  const parsed = ShotDocument.safeParse(input);
  if (!parsed.success) {
    const iss = parsed.error.issues[0];
    throw new MechanicsInputError(iss.path as InputPath, iss.message);
  }
  const doc = parsed.data;
  const cal = checkCalibration(doc.calibration);
  if (cal) throw new MechanicsInputError(["calibration", ...cal.path], cal.message);
  const clip = clipOf(doc);
  checkEvents(doc, clip);

  const tracks: ParsedShot["tracks"] = {};
  for (const name of LANDMARKS) {
    const marks = doc.tracks[name];
    if (marks) tracks[name] = toImageTrack(marks, name, clip);
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
