// The tracking assist: from one analyst mark, propose the landmark on the following (or preceding)
// frames by template matching in a window predicted from the recent motion; stop honestly at the
// first frame that does not match well enough.
import { TrackInputError } from "./errors";
import { createCvMatcher, type Matcher } from "./matcher";
import { loadOpenCv } from "./opencv";
import { createPrefetcher } from "./prefetch";
import { captureReference, type Reference } from "./reference";
import { searchFrame } from "./search";
import type { GrayFrame, Proposal, StopReason, TrackProgress, TrackRequest, TrackResult } from "./types";

/** A reference with the landmark's angle when it was captured and the first score it got. */
interface Look {
  ref: Reference;
  angle0: number;
  firstScore: number | null;
}
import { resolveRequest } from "./validate";

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
const PREFETCH_DEPTH = 2;
/** Work between pauses for the event loop, so a cancel message is read even when frames come from memory. */
const YIELD_EVERY_MS = 30;

export interface TrackDeps {
  /** A matcher to use (and not dispose); default: OpenCV's, created and freed per run. */
  matcher?: Matcher;
}

export async function track(request: TrackRequest, onProgress?: (p: TrackProgress) => void, deps: TrackDeps = {}): Promise<TrackResult> {
  const req = resolveRequest(request);
  const { frames, start, prior, direction, templateSize: size, threshold, signal, total, turning } = req;
  const minSize = Math.max(8, Math.ceil(size / 2));
  const proposals: Proposal[] = [];
  const stop = (reason: StopReason, frame: number | null, confidence: number | null, message: string): TrackResult => ({
    proposals,
    stop: { reason, frame, confidence, message },
  });
  const cancelled = () => stop("cancelled", null, null, `cancelled after ${proposals.length} proposals`);
  if (signal?.aborted) return cancelled();

  const matcher = deps.matcher ?? createCvMatcher((await loadOpenCv()).cv);
  const ctx = { matcher, minSize, exclusion: Math.max(2, size / 4) };
  try {
    let first: GrayFrame;
    try {
      first = await frames.frame(start.frame, signal);
    } catch (e) {
      if (signal?.aborted) return cancelled();
      throw e;
    }
    checkFrame(first, start.frame, first);
    for (const [field, m] of [["start", start], ["prior", prior]] as const)
      if (m && !(m.x >= 0 && m.y >= 0 && m.x < first.width && m.y < first.height))
        throw new TrackInputError(field, `(${m.x}, ${m.y}) lies outside the ${first.width}×${first.height} frame`);
    const ref = captureReference(first, start.x, start.y, size, minSize, turning);
    if (!ref)
      throw new TrackInputError("templateSize", `a ${size} px template around (${start.x}, ${start.y}) keeps less than ${minSize} px inside the ${first.width}×${first.height} frame`);
    // Velocities per frame index (+1), so they hold for either direction.
    let velocity = prior ? { x: (start.x - prior.x) / (start.frame - prior.frame), y: (start.y - prior.y) / (start.frame - prior.frame) } : null;
    // The landmark's angle relative to the start frame, and its change per frame index (+1).
    let angle = 0;
    let spin = 0;
    let last = { x: start.x, y: start.y };
    let look: Look = { ref, angle0: 0, firstScore: null };
    let looks: Look[] = [look];
    const frameAt = (k: number) => start.frame + direction * k;
    const ahead = createPrefetcher(frames, frameAt, total, Math.max(0, Math.min(16, Math.floor(frames.prefetch ?? PREFETCH_DEPTH))), signal);

    let lastPause = Date.now();
    for (let k = 1; k <= total; k++) {
      if (Date.now() - lastPause > YIELD_EVERY_MS) {
        await new Promise((r) => setTimeout(r, 0));
        lastPause = Date.now();
      }
      if (signal?.aborted) return cancelled();
      const index = frameAt(k);
      let frame: GrayFrame;
      try {
        frame = await ahead.get(k);
      } catch (e) {
        if (signal?.aborted) return cancelled();
        throw e;
      }
      checkFrame(frame, index, first);

      const predicted = velocity ? { x: last.x + velocity.x * direction, y: last.y + velocity.y * direction } : last;
      const radius = velocity ? req.searchRadius + RADIUS_PER_STEP * Math.hypot(velocity.x, velocity.y) : Math.max(req.searchRadius, size);
      const turned = angle + spin * direction;
      const attempt = (l: Look) => searchFrame(frame, l.ref, predicted, turned - l.angle0, radius, ctx);
      let m = attempt(look);
      if (!m) return stop("left-frame", index, null, `the landmark reaches the frame edge at frame ${index}`);
      const confident = RENEW_FROM * Math.max(...looks.map((l) => l.firstScore ?? 0));
      if (m.score < confident)
        for (const other of looks) {
          if (other === look) continue;
          const alt = attempt(other);
          if (alt && alt.score > m.score) [m, look] = [alt, other];
        }
      const atEdge = m.cropped || nearEdge(predicted, frame, size / 2);
      const { score, sideLobe, onBorder } = m;
      if (!(score >= threshold)) {
        const why = `confidence ${fmt(score)} below ${fmt(threshold)} at frame ${index}`;
        const s = Number.isFinite(score) ? score : null;
        return atEdge ? stop("left-frame", index, s, `${why}, at the frame edge`) : stop("low-confidence", index, s, why);
      }
      if (req.minPeakMargin > 0 && sideLobe !== null && score - sideLobe < req.minPeakMargin)
        return stop("ambiguous", index, score, `two places match almost equally (${fmt(score)} and ${fmt(sideLobe)}) at frame ${index}`);
      if (onBorder)
        return atEdge
          ? stop("left-frame", index, score, `the best match is cut by the frame edge at frame ${index}`)
          : stop("low-confidence", index, score, `no clear peak inside the search window at frame ${index}`);

      const proposal: Proposal = { frame: index, x: m.x, y: m.y, confidence: score, sideLobe };
      proposals.push(proposal);
      onProgress?.({ done: k, total, proposal });

      velocity = { x: (m.x - last.x) * direction, y: (m.y - last.y) * direction };
      const nowAngle = m.angle + look.angle0;
      spin = (nowAngle - angle) * direction;
      angle = nowAngle;
      last = { x: m.x, y: m.y };
      if (look.firstScore === null) look.firstScore = score;
      else if (score < RENEW_BELOW * look.firstScore && score >= confident && !atEdge) {
        // Only an uncut match becomes the new reference (a full template, not a cropped one).
        const fresh = captureReference(frame, m.x, m.y, size, size, turning);
        if (fresh) {
          look = { ref: fresh, angle0: angle, firstScore: null };
          looks = [looks[0], ...looks.slice(1).slice(2 - KEPT_LOOKS), look];
        }
      }
    }
    return stop("end-of-range", null, null, `${proposals.length} frames proposed, the end of the range`);
  } finally {
    if (!deps.matcher) matcher.dispose();
  }
}

function checkFrame(f: GrayFrame, index: number, first: GrayFrame) {
  if (!f || !(f.data instanceof Uint8Array) || f.data.length !== f.width * f.height)
    throw new Error(`frame ${index} is not an 8-bit grayscale frame (width × height bytes)`);
  if (f.width !== first.width || f.height !== first.height)
    throw new Error(`frame ${index} is ${f.width}×${f.height} but the start frame is ${first.width}×${first.height}`);
}

function nearEdge(p: { x: number; y: number }, f: GrayFrame, margin: number) {
  return p.x < margin || p.y < margin || p.x > f.width - margin || p.y > f.height - margin;
}

const fmt = (v: number) => (Number.isFinite(v) ? v.toFixed(2) : String(v));
