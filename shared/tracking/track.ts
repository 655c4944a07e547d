// The tracking assist: from one analyst mark, propose the landmark on the following (or preceding)
// frames by template matching in a window predicted from the recent motion; stop honestly at the
// first frame that does not match well enough.
import { TrackInputError } from "./errors";
import { LandmarkTracker } from "./landmark-tracker";
import { createCvMatcher, type Matcher } from "./matcher";
import { loadOpenCv } from "./opencv";
import { puckOptions } from "./puck-template";
import { createPrefetcher } from "./prefetch";
import type { GrayFrame, Proposal, StopReason, TrackProgress, TrackRequest, TrackResult } from "./types";
import { resolveRequest } from "./validate";

const PREFETCH_DEPTH = 2;
/** Work between pauses for the event loop, so a cancel message is read even when frames come from memory. */
const YIELD_EVERY_MS = 30;

export interface TrackDeps {
  /** A matcher to use (and not dispose); default: OpenCV's, created and freed per run. */
  matcher?: Matcher;
}

export async function track(request: TrackRequest, onProgress?: (p: TrackProgress) => void, deps: TrackDeps = {}): Promise<TrackResult> {
  const req = resolveRequest(request);
  const { frames, start, prior, direction, templateSize: size, signal, total } = req;
  const proposals: Proposal[] = [];
  const stop = (reason: StopReason, frame: number | null, confidence: number | null, message: string): TrackResult => ({
    proposals,
    stop: { reason, frame, confidence, message },
  });
  const cancelled = () => stop("cancelled", null, null, `cancelled after ${proposals.length} proposals`);
  if (signal?.aborted) return cancelled();

  const matcher = deps.matcher ?? createCvMatcher((await loadOpenCv()).cv);
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
    const tracker = LandmarkTracker.create(first, start, prior, { ...req, ...(req.object === "puck" ? puckOptions(first, start) : {}) }, matcher);
    if (!tracker) {
      const minSize = Math.max(8, Math.ceil(size / 2));
      throw new TrackInputError("templateSize", `a ${size} px template around (${start.x}, ${start.y}) keeps less than ${minSize} px inside the ${first.width}×${first.height} frame`);
    }
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
      const out = tracker.step(frame, index);
      if (out.stop) return { proposals, stop: out.stop };
      proposals.push(out.proposal);
      onProgress?.({ done: k, total, proposal: out.proposal });
    }
    return stop("end-of-range", null, null, `${proposals.length} frames proposed, the end of the range`);
  } finally {
    if (!deps.matcher) matcher.dispose();
  }
}

export function checkFrame(f: GrayFrame, index: number, first: GrayFrame) {
  if (!f || !(f.data instanceof Uint8Array) || f.data.length !== f.width * f.height)
    throw new Error(`frame ${index} is not an 8-bit grayscale frame (width × height bytes)`);
  if (f.width !== first.width || f.height !== first.height)
    throw new Error(`frame ${index} is ${f.width}×${f.height} but the start frame is ${first.width}×${first.height}`);
}
