// Every seeded landmark of a shot followed from one frame of seeds, forward to the shot's last
// frame and back to its first, all landmarks side by side on each frame so each can leave the
// others' pixels out: the puck's template never holds the blade, the blade's never the puck.
// Frames come from a FrameSource numbered like the clip (the seed frame's number, ±1, …).
import { LANDMARKS, type Landmark } from "../schemas/shot-document";
import { TrackInputError } from "./errors";
import { LandmarkTracker, type LandmarkOptions } from "./landmark-tracker";
import { createCvMatcher, type Matcher } from "./matcher";
import { loadOpenCv } from "./opencv";
import { findPuckSilhouette, type PuckSilhouette } from "./puck-silhouette";
import { puckRegion, puckTemplateOptions } from "./puck-template";
import { mayTouch, type Region, type Vec2 } from "./regions";
import { checkFrame } from "./track";
import type { FrameSource, GrayFrame, Proposal, TrackStop } from "./types";
import { DEFAULTS } from "./validate";

export interface ShotTrackRequest {
  frames: FrameSource;
  /** The shot's frames, inclusive. */
  first: number;
  last: number;
  /** The frame the analyst placed the seeds on. */
  seedFrame: number;
  seeds: Partial<Record<Landmark, Vec2>>;
  signal?: AbortSignal;
}

export interface LandmarkRun {
  /** Proposals in frame order (the seed itself is not one). */
  proposals: Proposal[];
  /** Why each direction ended; `frame` is the first frame not proposed. */
  forward: TrackStop;
  backward: TrackStop;
}

export interface ShotTrackResult {
  tracks: Partial<Record<Landmark, LandmarkRun>>;
  /** The puck as found around its seed (scale bar, template mask), when it was found. */
  puck: PuckSilhouette | null;
  /** Landmark-frames tried (proposed or stopped). */
  work: number;
}

export interface ShotTrackProgress {
  /** Landmark-frames done and the most there can be. */
  done: number;
  total: number;
}

export interface ShotTrackDeps {
  matcher?: Matcher;
}

/** Heights and margins of the blade's band, as shares of the puck's diameter in pixels. */
const BLADE_HEIGHT = 0.9;
const BLADE_BELOW = 0.15;
const BLADE_PAST_ENDS = 0.25;
/** Blade height as a share of its length when no puck says how large things are. */
const BLADE_HEIGHT_OF_LENGTH = 0.25;
/** The shaft's half-width as a share of the puck's diameter (a shaft is ~27 mm across). */
const SHAFT_HALF_WIDTH = 0.18;
const YIELD_EVERY_MS = 30;

/** The blade as a band above the heel–toe line, in frame px. */
export function bladeBand(heel: Vec2, toe: Vec2, height: number, below: number, pastEnds: number): Region {
  const len = Math.hypot(toe[0] - heel[0], toe[1] - heel[1]) || 1;
  const u: Vec2 = [(toe[0] - heel[0]) / len, (toe[1] - heel[1]) / len];
  // "Up" is the side of the line away from the ice: the picture's top.
  let n: Vec2 = [u[1], -u[0]];
  if (n[1] > 0) n = [-n[0], -n[1]];
  const at = (p: Vec2, along: number, up: number): Vec2 => [p[0] + u[0] * along + n[0] * up, p[1] + u[1] * along + n[1] * up];
  return { kind: "polygon", points: [at(heel, -pastEnds, -below), at(toe, pastEnds, -below), at(toe, pastEnds, height), at(heel, -pastEnds, height)] };
}

/** The shaft from the heel towards the bottom hand, as a strip of the given half-width. */
export function shaftStrip(heel: { x: number; y: number }, hand: { x: number; y: number }, halfWidth: number): Region {
  const len = Math.hypot(hand.x - heel.x, hand.y - heel.y) || 1;
  const n: Vec2 = [(-(hand.y - heel.y) / len) * halfWidth, ((hand.x - heel.x) / len) * halfWidth];
  return { kind: "polygon", points: [[heel.x + n[0], heel.y + n[1]], [hand.x + n[0], hand.y + n[1]], [hand.x - n[0], hand.y - n[1]], [heel.x - n[0], heel.y - n[1]]] };
}

export async function trackShot(req: ShotTrackRequest, onProgress?: (p: ShotTrackProgress) => void, deps: ShotTrackDeps = {}): Promise<ShotTrackResult> {
  const { frames, first, last, seedFrame, signal } = req;
  if (!(Number.isInteger(first) && Number.isInteger(last) && first <= last)) throw new TrackInputError("frames", `the shot's frames ${first}–${last} are not a range`);
  if (!(Number.isInteger(seedFrame) && seedFrame >= first && seedFrame <= last)) throw new TrackInputError("seedFrame", `frame ${seedFrame} is outside the shot's frames ${first}–${last}`);
  const seeded = LANDMARKS.filter((k) => req.seeds[k]);
  if (!seeded.length) throw new TrackInputError("seeds", "place at least one landmark on the seed frame");

  const matcher = deps.matcher ?? createCvMatcher((await loadOpenCv()).cv);
  try {
    const seedImage = await frames.frame(seedFrame, signal);
    checkFrame(seedImage, seedFrame, seedImage);
    for (const k of seeded) {
      const [x, y] = req.seeds[k]!;
      if (!(x >= 0 && y >= 0 && x < seedImage.width && y < seedImage.height))
        throw new TrackInputError(`seeds.${k}`, `(${x}, ${y}) lies outside the ${seedImage.width}×${seedImage.height} frame`);
    }
    const puck = req.seeds.puck ? findPuckSilhouette(seedImage, ...req.seeds.puck) : null;
    const puckUsable = puck && !puck.doubt ? puck : null;
    const total = seeded.length * (last - first);
    const progress = { done: 0, total };
    const tracks: ShotTrackResult["tracks"] = {};
    for (const k of seeded) tracks[k] = { proposals: [], forward: endStop(last, "last"), backward: endStop(first, "first") };

    const pass = async (direction: 1 | -1) => {
      const end = direction === 1 ? last : first;
      // Where each landmark is on the frame being worked on (the seed frame to begin with).
      const at: Partial<Record<Landmark, { x: number; y: number }>> = {};
      for (const k of seeded) at[k] = { x: req.seeds[k]![0], y: req.seeds[k]![1] };
      const bladeHeight = () => {
        const h = at.bladeHeel, t = at.bladeToe;
        if (puckUsable) return BLADE_HEIGHT * puckUsable.widthPx;
        return h && t ? BLADE_HEIGHT_OF_LENGTH * Math.hypot(t.x - h.x, t.y - h.y) : 0;
      };
      const scale = puckUsable?.widthPx ?? 0;
      const band = (tight: boolean): Region | null => {
        const h = at.bladeHeel, t = at.bladeToe;
        if (!h || !t) return null;
        const height = bladeHeight();
        return tight ? bladeBand([h.x, h.y], [t.x, t.y], height, 0, 0) : bladeBand([h.x, h.y], [t.x, t.y], height, Math.max(4, BLADE_BELOW * scale), Math.max(6, BLADE_PAST_ENDS * scale));
      };
      // The blade where it is expected on this frame (the puck is searched before the blade).
      const predictedBand = (): Region | null => {
        const h = live.get("bladeHeel")?.predicted(), t = live.get("bladeToe")?.predicted();
        return h && t ? bladeBand([h.x, h.y], [t.x, t.y], bladeHeight(), 0, 0) : band(true);
      };
      const options = (k: Landmark): LandmarkOptions => {
        const base = { direction, threshold: DEFAULTS.threshold, minPeakMargin: DEFAULTS.minPeakMargin, searchRadius: DEFAULTS.searchRadius };
        if (k === "puck") return { ...base, ...(puckUsable ? puckTemplateOptions(puckUsable) : { turning: false, templateSize: DEFAULTS.templateSize }) };
        if (k === "bladeHeel" || k === "bladeToe") {
          const b = band(false);
          const include = () => {
            const now = band(false);
            return now ? [now] : null;
          };
          return { ...base, turning: true, templateSize: DEFAULTS.templateSize, include: b ? include : null };
        }
        return { ...base, turning: true, templateSize: DEFAULTS.templateSize };
      };
      const live = new Map<Landmark, LandmarkTracker>();
      for (const k of seeded) {
        const [x, y] = req.seeds[k]!;
        const t = LandmarkTracker.create(seedImage, { frame: seedFrame, x, y }, undefined, options(k), matcher);
        if (!t) {
          const stop: TrackStop = { reason: "left-frame", frame: seedFrame + direction, confidence: null, message: `${k} is too close to the frame edge on the seed frame to be followed` };
          tracks[k]![direction === 1 ? "forward" : "backward"] = stop;
          progress.done += Math.abs(end - seedFrame);
          continue;
        }
        live.set(k, t);
      }
      // The puck first (its silhouette is the most distinct; it leaves out where the blade is
      // expected), then the blade (leaving out where the puck was found: a puck's end looks much
      // like a blade's toe), then the shaft.
      const order: Landmark[] = ["puck", "bladeHeel", "bladeToe", "bottomHand", "topHand", "buttEnd"];
      // Rigid parts: the blade (heel → toe) and the shaft (bottom hand → top hand) turn as one, so
      // each landmark on them turns by the part's angle, measured from the two predictions.
      const seedAngle = (a: Landmark, b: Landmark) => (req.seeds[a] && req.seeds[b] ? Math.atan2(req.seeds[b]![1] - req.seeds[a]![1], req.seeds[b]![0] - req.seeds[a]![0]) : null);
      const parts: { members: Landmark[]; from: Landmark; to: Landmark; angle0: number | null; rigid: boolean }[] = [
        { members: ["bladeHeel", "bladeToe"], from: "bladeHeel", to: "bladeToe", angle0: seedAngle("bladeHeel", "bladeToe"), rigid: true },
        // The shaft bends between the hands: its chord is where the turning search starts, not the answer.
        { members: ["bottomHand", "topHand", "buttEnd"], from: "bottomHand", to: "topHand", angle0: seedAngle("bottomHand", "topHand"), rigid: false },
      ];
      const angleHint = (k: Landmark): number | null => {
        const part = parts.find((p) => p.members.includes(k));
        if (!part || part.angle0 === null) return null;
        const a = live.get(part.from), b = live.get(part.to);
        if (!a || !b) return null;
        const [pa, pb] = [a.predicted(), b.predicted()];
        return Math.atan2(pb.y - pa.y, pb.x - pa.x) - part.angle0;
      };
      let lastPause = Date.now();
      for (let f = seedFrame + direction; live.size && (direction === 1 ? f <= end : f >= end); f += direction) {
        if (Date.now() - lastPause > YIELD_EVERY_MS) {
          await new Promise((r) => setTimeout(r, 0));
          lastPause = Date.now();
        }
        if (signal?.aborted) throw abortError(signal);
        const frame: GrayFrame = await frames.frame(f, signal);
        checkFrame(frame, f, seedImage);
        const hints = new Map(order.map((k) => [k, angleHint(k)]));
        let puckRedo: (() => void) | null = null;
        for (const k of order) {
          const t = live.get(k);
          if (!t) continue;
          let exclude: Region[] | undefined;
          if (k === "puck") {
            const b = predictedBand();
            if (b) exclude = [b];
          } else if (k === "bladeHeel" || k === "bladeToe") {
            exclude = [];
            const p = at.puck;
            if (puckUsable && p && live.has("puck")) exclude.push(puckRegion(p, puckUsable, false));
            // The shaft turns against the blade at the heel: its pixels would drag the heel along.
            const hand = live.get("bottomHand");
            if (k === "bladeHeel" && hand && puckUsable) exclude.push(shaftStrip(t.predicted(), hand.predicted(), SHAFT_HALF_WIDTH * puckUsable.widthPx));
          }
          const redo = k === "puck" ? t.checkpoint() : null;
          const out = t.step(frame, f, { exclude, angle: hints.get(k), rigid: parts.find((p) => p.members.includes(k))?.rigid });
          if (redo && out.proposal) puckRedo = redo;
          progress.done++;
          if (out.stop) {
            tracks[k]![direction === 1 ? "forward" : "backward"] = out.stop;
            live.delete(k);
            progress.done += Math.abs(end - f);
            delete at[k];
            continue;
          }
          tracks[k]!.proposals.push(out.proposal);
          at[k] = { x: out.proposal.x, y: out.proposal.y };
        }
        if (puckRedo && at.puck && puckUsable && live.has("puck")) {
          // The puck was searched against where the blade was expected; with the blade now found
          // beside it, the puck is searched once more, leaving out the blade where it is.
          const b = band(true), p = at.puck;
          if (b && mayTouch(b, p.x - puckUsable.widthPx, p.y - puckUsable.heightPx, 2 * puckUsable.widthPx, 2 * puckUsable.heightPx)) {
            puckRedo();
            const again = live.get("puck")!.step(frame, f, { exclude: [b] });
            if (again.proposal) {
              tracks.puck!.proposals[tracks.puck!.proposals.length - 1] = again.proposal;
              at.puck = { x: again.proposal.x, y: again.proposal.y };
            }
          }
        }
        onProgress?.({ ...progress });
      }
    };

    await pass(-1);
    await pass(1);
    for (const k of seeded) tracks[k]!.proposals.sort((a, b) => a.frame - b.frame);
    onProgress?.({ done: total, total });
    return { tracks, puck, work: total };
  } finally {
    if (!deps.matcher) matcher.dispose();
  }
}

function endStop(frame: number, which: "first" | "last"): TrackStop {
  return { reason: "end-of-range", frame: null, confidence: null, message: `followed to the shot's ${which} frame, ${frame}` };
}

function abortError(signal: AbortSignal): Error {
  const e = new Error(typeof signal.reason === "string" ? signal.reason : "tracking was cancelled");
  e.name = "AbortError";
  return e;
}
