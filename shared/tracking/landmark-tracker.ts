// One landmark followed frame by frame: predict from the recent motion, search around the
// prediction, decide whether the match is good enough, learn a new look when the old one fades.
// The browser assist (track.ts) runs one of these over a clip; the shot tracker runs one per
// landmark, side by side on the same frame, so each can leave the others' pixels out.
import type { Matcher } from "./matcher";
import { captureReference, type Reference } from "./reference";
import type { Region } from "./regions";
import { searchFrame, type FrameMatch, type SearchContext } from "./search";
import type { FrameMark, GrayFrame, Proposal, StopReason, TrackStop } from "./types";

/**
 * A reference is renewed once its score falls below 97 % of the first score it got — but only from
 * a confident match (at least 92 % of the best first score any kept reference got): a sudden drop
 * (the puck half behind the blade) keeps the old reference rather than learning the blade. Below
 * that level the other kept references (the analyst's own and the last renewed one) are tried as
 * well, so a look learnt by mistake is left again once the true one reappears.
 */
const RENEW_BELOW = 0.97;
const RENEW_FROM = 0.92;
const KEPT_LOOKS = 3;
/** Search radius grows with speed: constant velocity misses by a share of the step when it bends. */
const RADIUS_PER_STEP = 0.25;
/** Before stopping at a low score, one search this many times wider (a step larger than the window). */
const RECOVER_FACTOR = 6;
const RECOVER_MAX_RADIUS = 256;

export interface LandmarkOptions {
  direction: 1 | -1;
  templateSize: number;
  threshold: number;
  minPeakMargin: number;
  searchRadius: number;
  turning: boolean;
  /** The landmark's own object around (x, y) on a frame being captured: the template's mask. */
  include?: ((x: number, y: number) => Region[] | null) | null;
  /** Learn a new look when the old one fades (default true). */
  renew?: boolean;
  /** Try one much wider search before stopping (default true). */
  recover?: boolean;
}

/** What the other landmarks say about this one on the frame being searched. */
export interface StepHints {
  /** Their pixels, left out of the match. */
  exclude?: Region[];
  /**
   * The landmark's angle relative to the start frame, from the part it sits on (the blade from heel
   * to toe, the shaft from hand to hand): where the turning search starts.
   */
  angle?: number | null;
  /** The part is rigid (the blade): take that angle as it is and search the position only. */
  rigid?: boolean;
}

/** A reference with the landmark's angle when it was captured and the first score it got. */
interface Look {
  ref: Reference;
  angle0: number;
  firstScore: number | null;
}

export type StepOutcome = { proposal: Proposal; stop?: undefined } | { stop: TrackStop; proposal?: undefined };

export class LandmarkTracker {
  private velocity: { x: number; y: number } | null;
  /** The landmark's angle relative to the start frame, and its change per frame index (+1). */
  private angle = 0;
  private spin = 0;
  private last: { x: number; y: number };
  private look: Look;
  private looks: Look[];
  private readonly ctx: SearchContext;

  /** Null when too little of the template would lie inside the start frame. */
  static create(first: GrayFrame, start: FrameMark, prior: FrameMark | undefined, o: LandmarkOptions, matcher: Matcher): LandmarkTracker | null {
    const minSize = Math.max(8, Math.ceil(o.templateSize / 2));
    const ref = captureReference(first, start.x, start.y, o.templateSize, minSize, o.turning, o.include?.(start.x, start.y));
    return ref ? new LandmarkTracker(ref, start, prior, o, matcher, minSize) : null;
  }

  private constructor(ref: Reference, start: FrameMark, prior: FrameMark | undefined, private readonly o: LandmarkOptions, matcher: Matcher, minSize: number) {
    this.ctx = { matcher, minSize, exclusion: Math.max(2, o.templateSize / 4) };
    // Velocities per frame index (+1), so they hold for either direction.
    this.velocity = prior ? { x: (start.x - prior.x) / (start.frame - prior.frame), y: (start.y - prior.y) / (start.frame - prior.frame) } : null;
    this.last = { x: start.x, y: start.y };
    this.look = { ref, angle0: 0, firstScore: null };
    this.looks = [this.look];
  }

  /** A way back to the state before the next step, to search a frame again with better hints. */
  checkpoint(): () => void {
    const saved = { velocity: this.velocity, angle: this.angle, spin: this.spin, last: this.last, look: this.look, looks: this.looks };
    const firstScores = this.looks.map((l) => l.firstScore);
    return () => {
      Object.assign(this, saved);
      this.looks.forEach((l, i) => (l.firstScore = firstScores[i]));
    };
  }

  /** Where the landmark is expected on the next frame of the run. */
  predicted(): { x: number; y: number } {
    const d = this.o.direction;
    return this.velocity ? { x: this.last.x + this.velocity.x * d, y: this.last.y + this.velocity.y * d } : this.last;
  }

  /** The landmark on `frame` (numbered `index`), with what the other landmarks tell. */
  step(frame: GrayFrame, index: number, hints: StepHints = {}): StepOutcome {
    const { direction, threshold, templateSize: size } = this.o;
    const stop = (reason: StopReason, confidence: number | null, message: string): StepOutcome => ({ stop: { reason, frame: index, confidence, message } });
    const exclude = hints.exclude;
    const hinted = this.o.turning && typeof hints.angle === "number" && Number.isFinite(hints.angle);
    const fixed = hinted && hints.rigid === true;
    let ctx: SearchContext = exclude?.length ? { ...this.ctx, exclude } : this.ctx;
    if (fixed) ctx = { ...ctx, turnSearch: false };
    const predicted = this.predicted();
    const radius = this.velocity ? this.o.searchRadius + RADIUS_PER_STEP * Math.hypot(this.velocity.x, this.velocity.y) : Math.max(this.o.searchRadius, size);
    let turned = hinted ? hints.angle! : this.angle + this.spin * direction;
    const attempt = (l: Look, r = radius) => searchFrame(frame, l.ref, predicted, turned - l.angle0, r, ctx);
    let look = this.look;
    let m = attempt(look);
    if (!m) return stop("left-frame", null, `the landmark reaches the frame edge at frame ${index}`);
    const confident = RENEW_FROM * Math.max(...this.looks.map((l) => l.firstScore ?? 0));
    if (fixed && m.score < confident) {
      // The hint did not hold (the part bent or the partner strayed): search the angle after all.
      ctx = { ...ctx, turnSearch: true };
      turned = this.angle + this.spin * direction;
      const searched = attempt(look);
      if (searched && searched.score > m.score) m = searched;
    }
    if (m.score < confident)
      for (const other of this.looks) {
        if (other === look) continue;
        const alt = attempt(other);
        if (alt && alt.score > m.score) [m, look] = [alt, other];
      }
    let atEdge = m.cropped || nearEdge(predicted, frame, size / 2);
    if (this.o.recover !== false && !atEdge && (!(m.score >= threshold) || m.onBorder)) {
      // A step far larger than the window (the puck struck from rest): one wide look before giving up.
      const wide = attempt(look, Math.min(RECOVER_MAX_RADIUS, Math.max(RECOVER_FACTOR * radius, 3 * size)));
      if (wide && wide.score >= threshold && !wide.onBorder && (wide.sideLobe === null || wide.score - wide.sideLobe >= this.o.minPeakMargin)) {
        m = wide;
        atEdge = m.cropped || nearEdge(m, frame, size / 2);
      }
    }
    const { score, sideLobe, onBorder } = m;
    if (!(score >= threshold)) {
      const why = `confidence ${fmt(score)} below ${fmt(threshold)} at frame ${index}`;
      const s = Number.isFinite(score) ? score : null;
      return atEdge ? stop("left-frame", s, `${why}, at the frame edge`) : stop("low-confidence", s, why);
    }
    if (this.o.minPeakMargin > 0 && sideLobe !== null && score - sideLobe < this.o.minPeakMargin)
      return stop("ambiguous", score, `two places match almost equally (${fmt(score)} and ${fmt(sideLobe)}) at frame ${index}`);
    if (onBorder)
      return atEdge
        ? stop("left-frame", score, `the best match is cut by the frame edge at frame ${index}`)
        : stop("low-confidence", score, `no clear peak inside the search window at frame ${index}`);

    this.advance(m, look, frame, atEdge);
    return { proposal: { frame: index, x: m.x, y: m.y, confidence: score, sideLobe } };
  }

  private advance(m: FrameMatch, look: Look, frame: GrayFrame, atEdge: boolean) {
    const d = this.o.direction;
    this.velocity = { x: (m.x - this.last.x) * d, y: (m.y - this.last.y) * d };
    const nowAngle = m.angle + look.angle0;
    this.spin = (nowAngle - this.angle) * d;
    this.angle = nowAngle;
    this.last = { x: m.x, y: m.y };
    this.look = look;
    const confident = RENEW_FROM * Math.max(...this.looks.map((l) => l.firstScore ?? 0));
    if (look.firstScore === null) look.firstScore = m.score;
    else if (this.o.renew !== false && m.score < RENEW_BELOW * look.firstScore && m.score >= confident && !atEdge && !m.excluded) {
      // Only an uncut match with nothing else in view becomes the new reference (a whole template of the landmark alone).
      const size = this.o.templateSize;
      const fresh = captureReference(frame, m.x, m.y, size, size, this.o.turning, this.o.include?.(m.x, m.y));
      if (fresh) {
        this.look = { ref: fresh, angle0: this.angle, firstScore: null };
        this.looks = [this.looks[0], ...this.looks.slice(1).slice(2 - KEPT_LOOKS), this.look];
      }
    }
  }
}

function nearEdge(p: { x: number; y: number }, f: GrayFrame, margin: number) {
  return p.x < margin || p.y < margin || p.x > f.width - margin || p.y > f.height - margin;
}

const fmt = (v: number) => (Number.isFinite(v) ? v.toFixed(2) : String(v));
