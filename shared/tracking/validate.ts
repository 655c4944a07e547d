// Checks a track request before any frame is read, so bad input fails with one clear line.
import { TrackInputError } from "./errors";
import type { FrameMark, TrackRequest } from "./types";

export const DEFAULTS = { templateSize: 48, threshold: 0.7, minPeakMargin: 0.05, searchRadius: 8, turning: true } as const;

export interface ResolvedRequest extends Required<Omit<TrackRequest, "prior" | "signal" | "maxFrames" | "object">> {
  prior?: FrameMark;
  object?: "puck";
  signal?: AbortSignal;
  /** Proposals this run can make at most (maxFrames clipped to the clip). */
  total: number;
}

const isWhole = (n: unknown): n is number => typeof n === "number" && Number.isInteger(n);

function checkMark(field: string, m: FrameMark | undefined, length: number): FrameMark {
  if (!m || typeof m !== "object") throw new TrackInputError(field, "a mark {frame, x, y} is required");
  if (!isWhole(m.frame) || m.frame < 0 || m.frame >= length)
    throw new TrackInputError(`${field}.frame`, `must be a whole frame number from 0 to ${length - 1} (got ${String(m.frame)})`);
  if (!Number.isFinite(m.x) || !Number.isFinite(m.y))
    throw new TrackInputError(field, `coordinates must be finite numbers (got ${String(m.x)}, ${String(m.y)})`);
  return { frame: m.frame, x: m.x, y: m.y };
}

function inRange(field: string, v: number | undefined, fallback: number, lo: number, hi: number, whole = false): number {
  if (v === undefined) return fallback;
  if (typeof v !== "number" || !Number.isFinite(v) || v < lo || v > hi || (whole && !Number.isInteger(v)))
    throw new TrackInputError(field, `must be ${whole ? "a whole number" : "a number"} from ${lo} to ${hi} (got ${String(v)})`);
  return v;
}

function checkBoolean(field: string, v: unknown): boolean {
  if (typeof v !== "boolean") throw new TrackInputError(field, `must be true or false (got ${String(v)})`);
  return v;
}

function checkObject(v: unknown): "puck" {
  if (v !== "puck") throw new TrackInputError("object", `must be "puck" when given (got ${String(v)})`);
  return v;
}

export function resolveRequest(req: TrackRequest): ResolvedRequest {
  const frames = req?.frames;
  if (!frames || typeof frames.frame !== "function" || !isWhole(frames.length) || frames.length < 1)
    throw new TrackInputError("frames", "a frame source with a length of 1 or more and a frame(index) method is required");
  if (req.direction !== 1 && req.direction !== -1) throw new TrackInputError("direction", `must be 1 or -1 (got ${String(req.direction)})`);
  const start = checkMark("start", req.start, frames.length);
  const prior = req.prior === undefined ? undefined : checkMark("prior", req.prior, frames.length);
  if (prior && prior.frame === start.frame) throw new TrackInputError("prior.frame", "must differ from start.frame");
  const available = req.direction === 1 ? frames.length - 1 - start.frame : start.frame;
  const maxFrames = inRange("maxFrames", req.maxFrames, available, 1, Number.MAX_SAFE_INTEGER, true);
  return {
    frames,
    start,
    prior,
    direction: req.direction,
    templateSize: inRange("templateSize", req.templateSize, DEFAULTS.templateSize, 8, 256, true),
    threshold: inRange("threshold", req.threshold, DEFAULTS.threshold, 0.05, 0.99),
    minPeakMargin: inRange("minPeakMargin", req.minPeakMargin, DEFAULTS.minPeakMargin, 0, 1),
    searchRadius: inRange("searchRadius", req.searchRadius, DEFAULTS.searchRadius, 1, 256),
    turning: req.turning === undefined ? DEFAULTS.turning : checkBoolean("turning", req.turning),
    signal: req.signal,
    ...(req.object === undefined ? {} : { object: checkObject(req.object) }),
    total: Math.min(maxFrames, available),
  };
}
