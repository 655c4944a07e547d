import { z } from "zod";
import { DEFAULT_BENCH_SPAN_MM } from "../mechanics/bench-fit-normalise";

export { DEFAULT_BENCH_SPAN_MM };

// The document the mechanics engine reads: what the Digitise page produces, what the server
// stores per shot, and what `npm run metrics` takes. Pixels: x right, y down, in the displayed
// frame. Frames: whole numbers counted from the clip's first frame.

/** A regulation puck is 76.2 mm (3 in) across: IIHF Rule 13.1 [P]. */
export const PUCK_DIAMETER_MM = 76.2;
export const DEFAULT_PIXEL_ERROR_PX = 0.5;

const frameNumber = (what: string) =>
  z
    .number({ error: (iss) => (iss.input === undefined ? `${what} is required` : `${what} must be a number`) })
    .int({ error: `${what} must be a whole frame number` })
    .nonnegative({ error: `${what} must be 0 or more` });

const point = z.tuple([z.number({ error: "x must be a finite number" }), z.number({ error: "y must be a finite number" })], {
  error: "expected a point [x, y]",
});

export const ScaleBarCalibration = z.strictObject({
  type: z.literal("scaleBar"),
  a: point,
  b: point,
  lengthMm: z
    .number({ error: "lengthMm must be a number" })
    .positive({ error: "lengthMm must be above 0" })
    .default(PUCK_DIAMETER_MM),
});

export const PlanePoint = z.strictObject({ image: point, world: point });

export const PlaneCalibration = z.strictObject({
  type: z.literal("plane"),
  points: z.array(PlanePoint).min(4, { error: (iss) => `a plane calibration needs at least 4 points (got ${(iss.input as unknown[]).length})` }),
});

export const Calibration = z.discriminatedUnion("type", [ScaleBarCalibration, PlaneCalibration], {
  error: 'calibration.type must be "scaleBar" or "plane"',
});

export type Mark = [frame: number, x: number, y: number];

// Tracks can hold 100,000 marks; a per-element zod tuple costs ~100x more than this loop.
const track = z
  .unknown()
  .superRefine((v, ctx) => {
    if (!Array.isArray(v)) {
      ctx.addIssue({ code: "custom", message: "a track must be a list of [frame, x, y] marks" });
      return;
    }
    for (let i = 0; i < v.length; i++) {
      const m = v[i];
      if (!Array.isArray(m) || m.length !== 3) {
        ctx.addIssue({ code: "custom", path: [i], message: "a mark must be [frame, x, y]" });
        return;
      }
      const [f, x, y] = m;
      if (typeof f !== "number" || !Number.isInteger(f) || f < 0) {
        ctx.addIssue({ code: "custom", path: [i, 0], message: `frame must be a whole number, 0 or more (got ${String(f)})` });
        return;
      }
      if (typeof x !== "number" || !Number.isFinite(x) || typeof y !== "number" || !Number.isFinite(y)) {
        ctx.addIssue({
          code: "custom",
          path: [i, typeof x !== "number" || !Number.isFinite(x) ? 1 : 2],
          message: `coordinates must be finite numbers (got [${String(x)}, ${String(y)}])`,
        });
        return;
      }
    }
  })
  .transform((v) => v as Mark[]);

export const LANDMARKS = ["puck", "bladeHeel", "bladeToe", "bottomHand", "topHand", "buttEnd"] as const;
export type Landmark = (typeof LANDMARKS)[number];

export const Tracks = z.strictObject({
  puck: track,
  bladeHeel: track.optional(),
  bladeToe: track.optional(),
  bottomHand: track.optional(),
  topHand: track.optional(),
  buttEnd: track.optional(),
});

export const ShotEvents = z.strictObject({
  iceStrike: frameNumber("iceStrike").optional(),
  puckStrike: frameNumber("puckStrike"),
  peakBend: frameNumber("peakBend").optional(),
  release: frameNumber("release"),
});

export const ShotStick = z.strictObject({
  /** lbf per inch: the rated flex, or better the measured flex from a bench test. */
  flex: z.number({ error: "stick.flex must be a number" }).positive({ error: "stick.flex must be above 0" }),
  benchSpanMm: z
    .number({ error: "stick.benchSpanMm must be a number" })
    .positive({ error: "stick.benchSpanMm must be above 0" })
    .default(DEFAULT_BENCH_SPAN_MM),
});

export const ShotDocument = z.strictObject({
  captureFps: z
    .number({
      error: (iss) =>
        iss.input === undefined ? "captureFps is required: the camera's capture rate, not the playback rate" : "captureFps must be a number",
    })
    .positive({ error: "captureFps must be above 0" }),
  calibration: Calibration,
  /** Standard uncertainty of one digitised coordinate, in pixels. */
  pixelErrorPx: z.number({ error: "pixelErrorPx must be a number" }).nonnegative({ error: "pixelErrorPx must be 0 or more" }).default(DEFAULT_PIXEL_ERROR_PX),
  /** Relative standard uncertainty of the calibration's scale, e.g. 0.005 for 0.5 %. */
  calibrationErrorRel: z
    .number({ error: "calibrationErrorRel must be a number" })
    .min(0, { error: "calibrationErrorRel must be 0 or more" })
    .max(0.5, { error: "calibrationErrorRel is a fraction: 0.01 means 1 %" })
    .default(0),
  /** Cutoff of the zero-lag low-pass in Hz; "auto" = residual analysis; "raw" = no smoothing. */
  cutoffHz: z
    .union([z.number().positive(), z.literal("auto"), z.literal("raw")], { error: 'cutoffHz must be a number above 0, "auto" or "raw"' })
    .default("auto"),
  /** First and last frame of the clip (inclusive); marks and events must lie inside. */
  frameRange: z.tuple([frameNumber("frameRange[0]"), frameNumber("frameRange[1]")]).optional(),
  /** Number of frames in the clip (frames 0 … frameCount − 1). */
  frameCount: z.number().int({ error: "frameCount must be a whole number" }).positive({ error: "frameCount must be above 0" }).optional(),
  tracks: Tracks,
  events: ShotEvents,
  stick: ShotStick.nullable().optional(),
});

/** The document as sent (defaults optional). */
export type ShotDocumentInput = z.input<typeof ShotDocument>;
/** The document after parsing (defaults filled). */
export type ShotDocument = z.output<typeof ShotDocument>;
export type CalibrationInput = z.input<typeof Calibration>;
export type Calibration = z.output<typeof Calibration>;
export type ShotEvents = z.output<typeof ShotEvents>;
export type ShotStick = z.output<typeof ShotStick>;
