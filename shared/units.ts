// Unit conversions. SI inside, always; these exact factors convert at the edges only.
// Sources: 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N, 1 mph = 0.44704 m/s (exact by definition,
// international yard and pound agreement 1959; NIST SP 811 appendix B) [P].

export const MM_PER_IN = 25.4;
export const N_PER_LBF = 4.4482216152605;
export const MPS_PER_MPH = 0.44704;
export const MPS_PER_KMH = 1 / 3.6;
export const J_PER_FTLBF = N_PER_LBF * 0.3048; // 1 ft = 0.3048 m exactly
/** 1 lbf/in expressed in N/m: 4.4482216152605 / 0.0254 = 175.1268352... */
export const NPM_PER_LBF_PER_IN = N_PER_LBF / (MM_PER_IN / 1000);

export const inToMm = (v: number) => v * MM_PER_IN;
export const mmToIn = (v: number) => v / MM_PER_IN;
export const lbfToN = (v: number) => v * N_PER_LBF;
export const nToLbf = (v: number) => v / N_PER_LBF;
export const mphToMps = (v: number) => v * MPS_PER_MPH;
export const mpsToMph = (v: number) => v / MPS_PER_MPH;
export const kmhToMps = (v: number) => v * MPS_PER_KMH;
export const mpsToKmh = (v: number) => v / MPS_PER_KMH;
export const jToFtLbf = (v: number) => v / J_PER_FTLBF;
/** Flex rating (lbf per inch) to stiffness in N/m. */
export const flexToNPerM = (flex: number) => flex * NPM_PER_LBF_PER_IN;
export const nPerMToFlex = (k: number) => k / NPM_PER_LBF_PER_IN;

export type UnitSystem = "metric" | "imperial";

/** How each kind of quantity is shown in each system; values arrive in SI. */
export const display = {
  speed: {
    metric: { unit: "km/h", from: (mps: number) => mpsToKmh(mps) },
    imperial: { unit: "mph", from: (mps: number) => mpsToMph(mps) },
  },
  length: {
    metric: { unit: "mm", from: (mm: number) => mm },
    imperial: { unit: "in", from: (mm: number) => mmToIn(mm) },
  },
  force: {
    metric: { unit: "N", from: (n: number) => n },
    imperial: { unit: "lbf", from: (n: number) => nToLbf(n) },
  },
  energy: {
    metric: { unit: "J", from: (j: number) => j },
    imperial: { unit: "ft·lbf", from: (j: number) => jToFtLbf(j) },
  },
  moment: {
    metric: { unit: "N·m", from: (nm: number) => nm },
    imperial: { unit: "ft·lbf", from: (nm: number) => jToFtLbf(nm) },
  },
} as const;

export type Quantity = keyof typeof display;

/** Convert an SI value for display: returns the number and its unit label. */
export function toDisplay(q: Quantity, si: number, system: UnitSystem): { value: number; unit: string } {
  const d = display[q][system];
  return { value: d.from(si), unit: d.unit };
}
