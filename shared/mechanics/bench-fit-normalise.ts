// From a stiffness measured on the bench to EI and to the flex a rating would show.
// Three-point bend, load F at a from one support and b from the other on span L, deflection read
// under the load: δ = F a² b² / (3 E I L) (AISC "Beam Diagrams and Formulas", case 8). A rating is
// lbf per inch at mid-span [CP] on a reference span (1.0 m in Cross & Lindsey, "Flex of a Hockey
// Stick", 2016), where k = 48 EI / L³. See docs/decisions/021-flex-normalisation.md.
import { flexToNPerM, nPerMToFlex } from "../units";
import { StickLabInputError } from "./sticklab-error";

export const DEFAULT_REFERENCE_SPAN_MM = 1000;
export const DEFAULT_BENCH_SPAN_MM = 1000;

export interface BenchGeometry {
  /** Distance between the two supports. */
  spanMm: number;
  /** Load point measured from the first support; mid-span when left out. */
  loadPointMm?: number;
}

function checkPositive(value: number, field: string, what: string): void {
  if (!Number.isFinite(value) || value <= 0)
    throw new StickLabInputError(`${what} must be a number greater than zero (got ${value})`, { field });
}

/** The load point, checked to lie strictly between the supports. */
export function benchLoadPointMm({ spanMm, loadPointMm }: BenchGeometry): number {
  checkPositive(spanMm, "spanMm", "the span between supports");
  const a = loadPointMm ?? spanMm / 2;
  if (!Number.isFinite(a) || a <= 0 || a >= spanMm)
    throw new StickLabInputError(`the load point must lie between the supports, 0 to ${spanMm} mm (got ${a} mm)`, { field: "loadPointMm" });
  return a;
}

/** EI (N·m²) from a stiffness (N/mm, force per deflection under the load) measured on this geometry. */
export function eiFromBenchStiffness(stiffnessNPerMm: number, geometry: BenchGeometry): number {
  const a = benchLoadPointMm(geometry) / 1000;
  const L = geometry.spanMm / 1000;
  const b = L - a;
  const kNPerM = stiffnessNPerMm * 1000;
  return (kNPerM * a * a * b * b) / (3 * L);
}

/** Centre-load stiffness (N/mm) of a shaft of this EI on this span: k = 48 EI / L³. */
export function centreStiffnessNPerMm(eiNm2: number, spanMm: number = DEFAULT_REFERENCE_SPAN_MM): number {
  checkPositive(eiNm2, "eiNm2", "EI");
  checkPositive(spanMm, "referenceSpanMm", "the reference span");
  const L = spanMm / 1000;
  return (48 * eiNm2) / (L * L * L) / 1000;
}

/** The flex (lbf/in at mid-span) a shaft of this EI shows on the reference span. */
export function flexFromEi(eiNm2: number, referenceSpanMm: number = DEFAULT_REFERENCE_SPAN_MM): number {
  return nPerMToFlex(centreStiffnessNPerMm(eiNm2, referenceSpanMm) * 1000);
}

/** EI (N·m²) of a shaft rated at this flex on the reference span: EI = k L³ / 48. */
export function eiFromFlex(flex: number, referenceSpanMm: number = DEFAULT_REFERENCE_SPAN_MM): number {
  checkPositive(flex, "ratedFlex", "the flex");
  checkPositive(referenceSpanMm, "referenceSpanMm", "the reference span");
  const L = referenceSpanMm / 1000;
  return (flexToNPerM(flex) * L * L * L) / 48;
}
