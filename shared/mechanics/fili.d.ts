// The part of fili 2.0.3 the engine uses (the package ships no types).
declare module "fili" {
  interface BiquadCoeffs {
    /** Feedback a1, a2 (a0 normalised to 1). */
    a: [number, number];
    /** Feed-forward b0, b1, b2. */
    b: [number, number, number];
    k: number;
  }
  interface CascadeParams {
    /** Number of biquad stages: 1 = 2nd order. */
    order: number;
    characteristic: "butterworth" | "bessel";
    Fs: number;
    Fc: number;
    preGain?: boolean;
  }
  export class CalcCascades {
    lowpass(params: CascadeParams): BiquadCoeffs[];
  }
  const Fili: { CalcCascades: typeof CalcCascades };
  export default Fili;
}
