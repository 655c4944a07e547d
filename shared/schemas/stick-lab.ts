// Inputs of the stick-lab commands and API, as zod schemas. The rules that need more than a
// field's type (supports in order, loads on the stick, usable readings) come from the engine's
// own checks, so every entry point refuses the same things with the same words.
import { z } from "zod";
import { BEAM_LIMITS, beamInputProblem } from "../mechanics/beam-input";
import { DEFAULT_BENCH_SPAN_MM } from "../mechanics/bench-fit-normalise";
import { READINGS_LIMITS, readingsProblem } from "../mechanics/readings-csv";

const finite = z.number();

export const beamLoadSchema = z.strictObject({ xMm: finite, forceN: finite });

export const beamInputSchema = z
  .strictObject({
    lengthMm: finite.positive(),
    supportsMm: z.tuple([finite, finite]),
    loads: z.array(beamLoadSchema).min(1).max(BEAM_LIMITS.maxLoads),
    eiNm2: finite.positive().optional(),
  })
  .superRefine((beam, ctx) => {
    const problem = beamInputProblem(beam);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });
export type BeamInputJson = z.infer<typeof beamInputSchema>;

export const benchReadingSchema = z.strictObject({ load: finite, deflection: finite });

export const benchTestInputSchema = z
  .strictObject({
    /** Day of the test, YYYY-MM-DD. */
    date: z.iso.date(),
    spanMm: finite.positive().default(DEFAULT_BENCH_SPAN_MM),
    /** From the first support; mid-span when left out. */
    loadPointMm: finite.positive().optional(),
    loadUnit: z.enum(["lbf", "N"]),
    deflectionUnit: z.enum(["in", "mm"]),
    readings: z
      .array(benchReadingSchema)
      .min(READINGS_LIMITS.minRows, `need at least ${READINGS_LIMITS.minRows} readings to fit a line`)
      .max(READINGS_LIMITS.maxRows, `too many readings (the limit is ${READINGS_LIMITS.maxRows})`),
  })
  .superRefine((test, ctx) => {
    if (test.loadPointMm !== undefined && test.loadPointMm >= test.spanMm)
      ctx.addIssue({ code: "custom", path: ["loadPointMm"], message: `the load point must lie between the supports, 0 to ${test.spanMm} mm` });
    const problem = readingsProblem(test.readings, { load: test.loadUnit, deflection: test.deflectionUnit });
    if (problem) ctx.addIssue({ code: "custom", path: ["readings"], message: problem });
  })
  .transform((test) => ({ ...test, loadPointMm: test.loadPointMm ?? test.spanMm / 2 }));
export type BenchTestInput = z.input<typeof benchTestInputSchema>;
export type BenchTest = z.output<typeof benchTestInputSchema>;

const worldPoint = z.strictObject({ x: finite, y: finite });

export const shotBeamSourceSchema = z.strictObject({
  topHand: worldPoint,
  bottomHand: worldPoint,
  bladeHeel: worldPoint,
  deflectionMm: finite.nonnegative().optional(),
  stickEiNm2: finite.positive(),
  buttEnd: worldPoint.optional(),
});

/** All of a zod error on one line, for a CLI's stderr or an API's message. */
export function describeIssues(error: z.ZodError): string {
  return error.issues.map((i) => (i.path.length ? `${i.path.join(".")}: ${i.message}` : i.message)).join("; ");
}
