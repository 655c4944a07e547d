import type { ChordGeometry } from "./bend";
import { eiFromFlex } from "./bench-fit-normalise";

// Energy stored in the shaft, modelling it as a simply supported beam (the hands and the blade on
// the ice) loaded at the bottom hand. Beam formulas: AISC "Beam Diagrams and Formulas", cases 7–8.

/** Stiffness under a point load a from one support and b from the other: 3·EI·(a+b)/(a²·b²), N/m. */
export function pointLoadStiffness(eiNm2: number, aM: number, bM: number): number {
  return (3 * eiNm2 * (aM + bM)) / (aM * aM * bM * bM);
}

export interface StoredEnergy {
  valueJ: number;
  stiffnessNPerM: number;
  eiNm2: number;
}

/** U = ½·k_shot·δ², or null when the bottom hand does not project inside the chord. */
export function storedEnergy(flex: number, benchSpanMm: number, g: ChordGeometry): StoredEnergy | null {
  if (!(g.aMm > 0 && g.bMm > 0)) return null;
  const eiNm2 = eiFromFlex(flex, benchSpanMm); // k = flex·175.127 N/m, EI = k·L³/48
  const k = pointLoadStiffness(eiNm2, g.aMm / 1000, g.bMm / 1000);
  const d = g.deflectionMm / 1000;
  return { valueJ: 0.5 * k * d * d, stiffnessNPerM: k, eiNm2 };
}
