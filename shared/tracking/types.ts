// Types of the tracking assist. Coordinates are frame pixels, x right and y down, with the origin
// at the top-left corner of the top-left pixel: pixel (i, j) covers [i, i+1) × [j, j+1) and its
// centre is (i + 0.5, j + 0.5) — the convention of a canvas drawing the frame at (0, 0).

/** One 8-bit grayscale frame, rows top to bottom, no padding (data.length === width * height). */
export interface GrayFrame {
  width: number;
  height: number;
  data: Uint8Array;
}

/** Frames by index (0 … length − 1). `frame` may be slow (a JPEG decode); the tracker prefetches. */
export interface FrameSource {
  readonly length: number;
  frame(index: number, signal?: AbortSignal): Promise<GrayFrame>;
  /** Frames to ask for ahead of the one being matched (default 2); more when decodes run in parallel. */
  readonly prefetch?: number;
}

/** A landmark position on one frame. */
export interface FrameMark {
  frame: number;
  x: number;
  y: number;
}

export interface Proposal extends FrameMark {
  /** Normalised cross-correlation peak (TM_CCOEFF_NORMED), −1 … 1; 1 is a perfect match. */
  confidence: number;
  /** Highest other local peak of the same search, or null when there is none: how close a rival came. */
  sideLobe: number | null;
}

export type StopReason =
  /** The best match fell below the threshold: hidden, blurred or changed beyond recognition. */
  | "low-confidence"
  /** Another place matched almost as well as the best one, so the choice would be a guess. */
  | "ambiguous"
  /** The predicted position (or too much of the template) lies outside the frame. */
  | "left-frame"
  /** maxFrames proposals were made, or the clip ended. */
  | "end-of-range"
  /** The AbortSignal fired. */
  | "cancelled";

export interface TrackStop {
  reason: StopReason;
  /** The frame that could not be proposed; null when the run ended at the range or was cancelled before one was tried. */
  frame: number | null;
  /** Best score found on that frame, when a match was tried. */
  confidence: number | null;
  /** One line for the analyst, e.g. "confidence 0.31 below 0.60 at frame 212". */
  message: string;
}

export interface TrackResult {
  proposals: Proposal[];
  stop: TrackStop;
}

export interface TrackProgress {
  /** Frames handled so far (proposed), out of `total` (the most this run can propose). */
  done: number;
  total: number;
  /** The proposal just made. */
  proposal: Proposal;
}

export interface TrackOptions {
  /** 1 = following frames, −1 = preceding frames. */
  direction: 1 | -1;
  /** Most proposals to make (default: up to the end of the clip in that direction). */
  maxFrames?: number;
  /** Side of the square template in pixels (default 48). */
  templateSize?: number;
  /** Stop at the first frame whose NCC peak is below this (default 0.7). */
  threshold?: number;
  /** Stop when a rival peak comes within this of the best one (default 0.05; 0 turns the check off). */
  minPeakMargin?: number;
  /**
   * Also search the landmark's rotation (default true): needed for points on a turning stick or
   * hand; a puck seen from the side looks the same at every angle, so `false` is 3× faster there.
   */
  turning?: boolean;
  /** Smallest search radius around the predicted position, in pixels (default 8). */
  searchRadius?: number;
  /**
   * "puck": the landmark is a puck seen side-on. Its outline is found on the start frame and only
   * that outline is matched (not the blade or ice beside it, not a print on it), at a template
   * sized to it, never re-learnt. Falls back to the plain template when no puck is found there.
   */
  object?: "puck";
  signal?: AbortSignal;
}

export interface TrackRequest extends TrackOptions {
  frames: FrameSource;
  /** The analyst's mark the run starts from (not proposed again). */
  start: FrameMark;
  /** A second mark (usually the neighbouring frame) that gives the first velocity guess. */
  prior?: FrameMark;
}
