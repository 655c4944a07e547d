import { z } from "zod";
import { DEFAULT_BENCH_SPAN_MM } from "../mechanics/bench-fit-normalise";

export { DEFAULT_BENCH_SPAN_MM };

// The document the mechanics engine reads: what the Digitise page produces, what the server
// stores per shot, and what `npm run metrics` takes. Pixels: x right, y down, in the displayed
// frame. Frames: whole numbers counted from the clip's first frame.

/** A regulation puck is 76.2 mm (3 in) across: IIHF Rule 13.1 [P]. */
export const PUCK_DIAMETER_MM = 76.2;
export const DEFAULT_PIXEL_ERROR_PX = 0.5;
/** An event marked on a frame is taken as good to one frame either way [CP]. */
export const DEFAULT_EVENT_ERROR_FRAMES = 1;
export const MAX_EVENT_ERROR_FRAMES = 10;

// Messages name no field: the error's path does, and a form shows the message next to the field.
const needs = (what: string) => (iss: { code?: string; input: unknown; keys?: string[] }) =>
  iss.code === "unrecognized_keys" && iss.keys
    ? `unknown field${iss.keys.length > 1 ? "s" : ""} ${iss.keys.map((k) => `"${k}"`).join(", ")}`
    : iss.input === undefined
      ? "is required"
      : `must be ${what}`;

const frameNumber = () =>
  z.number({ error: needs("a frame number") }).int({ error: "must be a whole frame number" }).nonnegative({ error: "must be 0 or more" });

const point = z.tuple([z.number({ error: "must be a finite number" }), z.number({ error: "must be a finite number" })], {
  error: needs("a point [x, y] in pixels"),
});

export const ScaleBarCalibration = z.strictObject({
  type: z.literal("scaleBar"),
  a: point,
  b: point,
  lengthMm: z.number({ error: needs("a length in mm") }).positive({ error: "must be above 0" }).default(PUCK_DIAMETER_MM),
});

export const PlanePoint = z.strictObject({ image: point, world: point }, { error: needs("{ image: [x, y], world: [xMm, yMm] }") });

export const PlaneCalibration = z.strictObject({
  type: z.literal("plane"),
  points: z.array(PlanePoint, { error: needs("a list of points") }).min(4, { error: (iss) => `a plane calibration needs at least 4 points (got ${(iss.input as unknown[]).length})` }),
});

export const Calibration = z.discriminatedUnion("type", [ScaleBarCalibration, PlaneCalibration], {
  error: (iss) => (iss.input === undefined ? "is required" : 'needs type "scaleBar" (a, b, lengthMm) or "plane" (points)'),
});

export type Mark = [frame: number, x: number, y: number];

/** A track that is not a list. */
export const TRACK_NOT_A_LIST = "a track must be a list of [frame, x, y] marks";

/** The problem with mark i of a track (its path inside the track), or null for a good mark. */
export function markProblem(m: unknown, i: number): { path: number[]; message: string } | null {
  if (!Array.isArray(m) || m.length !== 3) return { path: [i], message: "a mark must be [frame, x, y]" };
  const f = m[0];
  const x = m[1];
  const y = m[2];
  if (typeof f !== "number" || !Number.isInteger(f) || f < 0) return { path: [i, 0], message: `frame must be a whole number, 0 or more (got ${String(f)})` };
  if (typeof x !== "number" || !Number.isFinite(x) || typeof y !== "number" || !Number.isFinite(y))
    return { path: [i, typeof x !== "number" || !Number.isFinite(x) ? 1 : 2], message: `coordinates must be finite numbers (got [${String(x)}, ${String(y)}])` };
  return null;
}

// Tracks can hold 100,000 marks; a per-element zod tuple costs ~100x more than this loop.
const track = z
  .custom<Mark[]>()
  .superRefine((v: unknown, ctx) => {
    if (!Array.isArray(v)) {
      ctx.addIssue({ code: "custom", message: TRACK_NOT_A_LIST });
      return;
    }
    for (let i = 0; i < v.length; i++) {
      const problem = markProblem(v[i], i);
      if (problem) {
        ctx.addIssue({ code: "custom", ...problem });
        return;
      }
    }
  });

// A clip's frame times (capture time, seconds) can run to 100,000 frames: checked in one loop.
const seconds = z.custom<number[]>().superRefine((v: unknown, ctx) => {
  if (!Array.isArray(v) || v.length === 0) {
    ctx.addIssue({ code: "custom", message: "must be a list of times in seconds, one per frame" });
    return;
  }
  for (let i = 0; i < v.length; i++)
    if (typeof v[i] !== "number" || !Number.isFinite(v[i])) {
      ctx.addIssue({ code: "custom", path: [i], message: `a time must be a finite number of seconds (got ${String(v[i])})` });
      return;
    }
});

/** Each frame's capture time: seconds[k] belongs to frame firstFrame + k. */
export const FrameTimes = z.strictObject(
  { firstFrame: frameNumber(), seconds },
  { error: needs("{ firstFrame, seconds: [...] }: the capture time of each frame from firstFrame on") },
);

export const LANDMARKS = ["puck", "bladeHeel", "bladeToe", "bottomHand", "topHand", "buttEnd"] as const;
export type Landmark = (typeof LANDMARKS)[number];

const tracksOf = (t: z.ZodType<Mark[], Mark[]>) =>
  z.strictObject(
    { puck: t, bladeHeel: t.optional(), bladeToe: t.optional(), bottomHand: t.optional(), topHand: t.optional(), buttEnd: t.optional() },
    { error: needs("an object of tracks: { puck, bladeHeel?, bladeToe?, bottomHand?, topHand? }") },
  );
export const Tracks = tracksOf(track);

export const ShotEvents = z.strictObject(
  {
    iceStrike: frameNumber().optional(),
    puckStrike: frameNumber(),
    peakBend: frameNumber().optional(),
    release: frameNumber(),
  },
  { error: needs("an object of event frames: { iceStrike?, puckStrike, peakBend?, release }") },
);

export const ShotStick = z.strictObject(
  {
    /** lbf per inch: the rated flex, or better the measured flex from a bench test. */
    flex: z.number({ error: needs("a flex in lbf per inch") }).positive({ error: "must be above 0" }),
    benchSpanMm: z.number({ error: needs("a span in mm") }).positive({ error: "must be above 0" }).default(DEFAULT_BENCH_SPAN_MM),
  },
  { error: needs("{ flex, benchSpanMm? } or null") },
);

export const ShotDocument = z.strictObject({
  captureFps: z
    .number({ error: (iss) => (iss.input === undefined ? "is required: the camera's capture rate, not the file's playback rate" : "must be a number") })
    .positive({ error: "must be above 0: the camera's capture rate in frames per second" }),
  calibration: Calibration,
  /** Standard uncertainty of one digitised coordinate, in pixels. */
  pixelErrorPx: z.number({ error: needs("a number of pixels") }).nonnegative({ error: "must be 0 or more" }).default(DEFAULT_PIXEL_ERROR_PX),
  /**
   * How far, in frames either way, each marked event (ice strike, puck strike, release) may be from
   * the true instant: the analyst's judgement, a uniform spread in the uncertainties. 0 = exact.
   */
  eventErrorFrames: z
    .number({ error: needs("a number of frames") })
    .min(0, { error: "must be 0 or more" })
    .max(MAX_EVENT_ERROR_FRAMES, { error: `is at most ${MAX_EVENT_ERROR_FRAMES} frames` })
    .default(DEFAULT_EVENT_ERROR_FRAMES),
  /** Relative standard uncertainty of the calibration's scale, e.g. 0.005 for 0.5 %. */
  calibrationErrorRel: z
    .number({ error: needs("a fraction") })
    .min(0, { error: "must be 0 or more" })
    .max(0.5, { error: "is a fraction, at most 0.5: 0.01 means 1 %" })
    .default(0),
  /** Cutoff of the zero-lag low-pass in Hz; "auto" = residual analysis; "raw" = no smoothing. */
  cutoffHz: z
    .union([z.number().positive(), z.literal("auto"), z.literal("raw")], { error: 'must be a number of Hz above 0, "auto" or "raw"' })
    .default("auto"),
  /** First and last frame of the clip (inclusive); marks and events must lie inside. */
  frameRange: z.tuple([frameNumber(), frameNumber()], { error: needs("[first, last] frame numbers") }).optional(),
  /** Number of frames in the clip (frames 0 … frameCount − 1). */
  frameCount: z.number({ error: needs("a number of frames") }).int({ error: "must be a whole number" }).positive({ error: "must be above 0" }).optional(),
  tracks: Tracks,
  events: ShotEvents,
  stick: ShotStick.nullable().optional(),
  /**
   * The clip's own frame clock in capture time (optional). Without it frame f is at f ÷ captureFps;
   * with it speeds and times follow each frame's real time (dropped frames, uneven clocks).
   */
  frameTimes: FrameTimes.optional(),
}, { error: needs("a shot document (a JSON object)") });

/**
 * The document with its tracks' marks not looked at: the mechanics engine checks each mark while it
 * copies it (validate-shot.ts, one pass over up to 100,000 marks a track instead of two) and, when
 * anything is wrong, names the first problem exactly as ShotDocument does.
 */
export const ShotDocumentMarksUnchecked = ShotDocument.extend({ tracks: tracksOf(z.custom<Mark[]>((v) => v !== undefined)) });

/** The document as sent (defaults optional). */
export type ShotDocumentInput = z.input<typeof ShotDocument>;
/** The document after parsing (defaults filled). */
export type ShotDocument = z.output<typeof ShotDocument>;
export type CalibrationInput = z.input<typeof Calibration>;
export type Calibration = z.output<typeof Calibration>;
export type ShotEvents = z.output<typeof ShotEvents>;
export type ShotStick = z.output<typeof ShotStick>;
export type FrameTimes = z.output<typeof FrameTimes>;
