import { z } from "zod";

// What the mechanics engine returns for one shot: stored by the server with the engine version,
// drawn by the Shot readout page, printed by `npm run metrics`. SI throughout (speeds m/s, lengths
// mm, energies J, times ms); angles in degrees. `uncertainty*` is the standard uncertainty u
// (value ± u); `interval95*` the 95 % coverage interval; null where it could not be estimated.
// `smoothingBias*` is the smoothing's estimated bias at that result (value − truth), already inside
// u and the interval (docs/decisions/140-cutoff-and-smoothing-bias.md). Fields marked optional are
// missing from results stored by engines before mechanics-1.2.0.

const u = z.number().nonnegative().nullable();
const interval = z.tuple([z.number(), z.number()]).nullable();

export const SEGMENT_LABELS = ["beforeStrike", "afterStrike", "contact", "afterRelease"] as const;

const Segment = z.enum(SEGMENT_LABELS);

/**
 * One readout chart's samples as columns: sample i is frame[i], tFromStrikeMs[i] (from the
 * puck-strike frame, negative before it) and value[i]; `segments` runs over them in order, each
 * [which separately smoothed piece of the track, how many samples in a row]. Columns rather than
 * an object a sample: a shot's answer is a quarter of the size (decision 202).
 */
export const Series = z
  .object({
    unit: z.string(),
    frame: z.array(z.number().int()),
    tFromStrikeMs: z.array(z.number()),
    value: z.array(z.number()),
    segments: z.array(z.tuple([Segment, z.number().int().positive()])),
  })
  .refine((s) => s.tFromStrikeMs.length === s.frame.length && s.value.length === s.frame.length && s.segments.reduce((n, r) => n + r[1], 0) === s.frame.length, {
    error: "a series has one frame, time and value a sample, and segments that cover them",
  });

/** One sample of a series as an object (seriesPoints in shared/mechanics/series-columns.ts). */
export interface SeriesPoint {
  frame: number;
  tFromStrikeMs: number;
  value: number;
  segment: SegmentLabel;
}

export const ResultNote = z.object({ code: z.string(), message: z.string() });

export const SMOOTHED_LANDMARKS = ["puck", "blade", "bladeHeel", "bottomHand", "topHand"] as const;

export const ShotResults = z.object({
  engineVersion: z.string(),
  puckExitSpeed: z.object({
    valueMps: z.number(),
    uncertaintyMps: u,
    interval95Mps: interval,
    marksUsed: z.number().int(),
    fromFrame: z.number().int(),
    toFrame: z.number().int(),
    /** RMS distance of the flight marks from the fitted straight line. */
    rmsResidualMm: z.number(),
  }),
  bladeSpeedAtStrike: z
    .object({
      valueMps: z.number(),
      uncertaintyMps: u,
      interval95Mps: interval,
      /**
       * Last frame of the approach the speed is read from: ⌈eventErrorFrames⌉ frames before puck
       * strike (or the blade's last mark within one marking step before that), carried on to the strike.
       */
      frame: z.number().int(),
      /** Blade point used: midpoint of heel and toe, or the one that was marked. */
      point: z.enum(["midpoint", "heel", "toe"]),
      smoothingBiasMps: z.number().optional(),
    })
    .nullable(),
  peakBend: z.object({ angleDeg: z.number(), uncertaintyDeg: u, interval95Deg: interval, frame: z.number().int(), smoothingBiasDeg: z.number().optional() }).nullable(),
  shaftDeflection: z
    .object({
      valueMm: z.number(),
      uncertaintyMm: u,
      interval95Mm: interval,
      frame: z.number().int(),
      /** Along the chord from the top hand / from the blade heel to the foot of the perpendicular. */
      aMm: z.number(),
      bMm: z.number(),
      smoothingBiasMm: z.number().optional(),
    })
    .nullable(),
  loadTimeMs: z.number().nullable(),
  /** From the marked events' own uncertainty (eventErrorFrames); null without an ice strike. */
  loadTimeUncertaintyMs: u.optional(),
  loadTimeInterval95Ms: interval.optional(),
  contactTimeMs: z.number(),
  contactTimeUncertaintyMs: u.optional(),
  contactTimeInterval95Ms: interval.optional(),
  /** One frame at the capture rate: the resolution of the times. */
  frameTimeMs: z.number(),
  storedEnergy: z
    .object({
      valueJ: z.number(),
      uncertaintyJ: u,
      interval95J: interval,
      frame: z.number().int(),
      /** Shaft stiffness for a load at the bottom hand, and EI from the flex (bench span). */
      shotStiffnessNPerM: z.number(),
      eiNm2: z.number(),
      smoothingBiasJ: z.number().optional(),
    })
    .nullable(),
  series: z.object({
    firstFrame: z.number().int(),
    puckSpeed: Series,
    bladeSpeed: Series,
    bendAngle: Series,
  }),
  smoothing: z.object({
    mode: z.enum(["residualAnalysis", "analyst", "raw"]),
    /** 2nd-order Butterworth run forward and backward; cutoff is the two-pass −3 dB point. */
    order: z.literal(2),
    passes: z.literal(2),
    cutoffHz: z.partialRecord(z.enum(SMOOTHED_LANDMARKS), z.number().nullable()),
  }),
  uncertainty: z.object({
    method: z.literal("monteCarlo"),
    trials: z.number().int(),
    seed: z.string(),
    pixelErrorPx: z.number(),
    calibrationErrorRel: z.number(),
    /** Frames either way each marked event may be off (uniform). */
    eventErrorFrames: z.number().optional(),
    coverage: z.literal(0.95),
  }),
  calibration: z.object({
    type: z.enum(["scaleBar", "plane"]),
    mmPerPx: z.number().nullable(),
    rmsResidualMm: z.number().nullable(),
  }),
  notes: z.array(ResultNote),
});

export type ShotResults = z.infer<typeof ShotResults>;
export type Series = z.infer<typeof Series>;
export type ResultNote = z.infer<typeof ResultNote>;
export type SegmentLabel = (typeof SEGMENT_LABELS)[number];
export type SmoothedLandmark = (typeof SMOOTHED_LANDMARKS)[number];
