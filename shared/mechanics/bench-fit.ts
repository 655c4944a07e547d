// The bench fit: a least-squares line of load on deflection gives the shaft's stiffness on the
// test span; EI follows from the three-point-bend formula, and the measured flex is the stiffness
// that EI would show at the centre of the reference span (the rating's own test).
import { nPerMToFlex, nToLbf, N_PER_LBF, MM_PER_IN } from "../units";
import { benchFitFlags, type BenchFitFlag } from "./bench-fit-flags";
import { fitLine } from "./bench-fit-line";
import { DEFAULT_BENCH_SPAN_MM, DEFAULT_REFERENCE_SPAN_MM, benchLoadPointMm, centreStiffnessNPerMm, eiFromBenchStiffness } from "./bench-fit-normalise";
import { readingsProblem, type BenchReading } from "./readings-csv";
import { StickLabInputError } from "./sticklab-error";

/** Shown at the top of any bench-test form, before loads are hung. */
export const BENCH_LOADING_CAUTION =
  "Bench loading can snap a shaft and throw fragments: wear eye protection, keep hands and faces clear of the shaft, " +
  "load gradually, and follow your facility's rules and the people responsible for them.";

export interface BenchFitOptions {
  /** Distance between the supports; default 1,000 mm. */
  spanMm?: number;
  /** Load point from the first support; default mid-span. Deflection is read under the load. */
  loadPointMm?: number;
  /** Span the flex rating refers to; default 1,000 mm. */
  referenceSpanMm?: number;
  /** The stick's printed flex, for % of rated. */
  ratedFlex?: number | null;
}

export interface BenchFit {
  n: number;
  /** Fitted slope of load on deflection, on the test span and load point. */
  stiffnessNPerMm: number;
  stiffnessLbfPerIn: number;
  interceptN: number;
  interceptLbf: number;
  r2: number;
  /** Measured load − fitted load, per reading. */
  residualsN: number[];
  residualsLbf: number[];
  /** Residuals over their standard error (dimensionless), per reading. */
  standardizedResiduals: number[];
  spanMm: number;
  loadPointMm: number;
  referenceSpanMm: number;
  /** Flexural rigidity recovered from the test geometry. */
  eiNm2: number;
  /** Centre-load stiffness on the reference span. */
  referenceStiffnessNPerMm: number;
  /** lbf per inch at the centre of the reference span: comparable with the printed rating. */
  measuredFlex: number;
  ratedFlex: number | null;
  /** 100 × measured / rated; null without a rating. */
  percentOfRated: number | null;
  flags: BenchFitFlag[];
}

/** Fit readings already in SI (see parseReadingsCsv / readingsToSi). Throws StickLabInputError. */
export function fitBench(readings: readonly BenchReading[], options: BenchFitOptions = {}): BenchFit {
  const raw = readings.map((r) => ({ load: r.loadN, deflection: r.deflectionMm }));
  const problem = readingsProblem(raw, { load: "N", deflection: "mm" });
  if (problem) throw new StickLabInputError(problem, { field: "readings" });
  const spanMm = options.spanMm ?? DEFAULT_BENCH_SPAN_MM;
  const loadPointMm = benchLoadPointMm({ spanMm, loadPointMm: options.loadPointMm });
  const referenceSpanMm = options.referenceSpanMm ?? DEFAULT_REFERENCE_SPAN_MM;
  const ratedFlex = options.ratedFlex ?? null;
  if (ratedFlex !== null && !(Number.isFinite(ratedFlex) && ratedFlex > 0))
    throw new StickLabInputError(`the rated flex must be a number greater than zero (got ${ratedFlex})`, { field: "ratedFlex" });

  const x = readings.map((r) => r.deflectionMm);
  const y = readings.map((r) => r.loadN);
  const line = fitLine(x, y);
  if (!(line.slope > 0))
    throw new StickLabInputError("the fitted stiffness is not positive: deflection does not grow with load; check the readings", { field: "readings" });

  const eiNm2 = eiFromBenchStiffness(line.slope, { spanMm, loadPointMm });
  const referenceStiffnessNPerMm = centreStiffnessNPerMm(eiNm2, referenceSpanMm);
  const measuredFlex = nPerMToFlex(referenceStiffnessNPerMm * 1000);
  return {
    n: line.n,
    stiffnessNPerMm: line.slope,
    stiffnessLbfPerIn: (line.slope / N_PER_LBF) * MM_PER_IN,
    interceptN: line.intercept,
    interceptLbf: nToLbf(line.intercept),
    r2: line.r2,
    residualsN: line.residuals,
    residualsLbf: line.residuals.map(nToLbf),
    standardizedResiduals: line.standardizedResiduals,
    spanMm,
    loadPointMm,
    referenceSpanMm,
    eiNm2,
    referenceStiffnessNPerMm,
    measuredFlex,
    ratedFlex,
    percentOfRated: ratedFlex === null ? null : (100 * measuredFlex) / ratedFlex,
    flags: benchFitFlags(x, y, line),
  };
}
