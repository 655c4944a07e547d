// The unit pairs a bench test is entered in (weights in lbf with an inch gauge, or N with a mm
// gauge), and the viewer's pair for showing readings back.
import type { UnitSystem } from "@shared/units";
import { inToMm, lbfToN, mmToIn, nToLbf } from "@shared/units";

export type BenchUnits = "imperial" | "metric";

export const benchUnits = {
  imperial: { load: "lbf", deflection: "in", label: "lbf and inches" },
  metric: { load: "N", deflection: "mm", label: "newtons and millimetres" },
} as const satisfies Record<BenchUnits, { load: "lbf" | "N"; deflection: "in" | "mm"; label: string }>;

export const benchUnitsFor = (system: UnitSystem): BenchUnits => system;

/** SI (N, mm) → the pair's units. */
export const loadFromN = (u: BenchUnits, n: number) => (u === "imperial" ? nToLbf(n) : n);
export const deflectionFromMm = (u: BenchUnits, mm: number) => (u === "imperial" ? mmToIn(mm) : mm);
export const loadToN = (u: BenchUnits, v: number) => (u === "imperial" ? lbfToN(v) : v);
export const lengthToMm = (u: UnitSystem, v: number) => (u === "imperial" ? inToMm(v) : v);
export const lengthFromMm = (u: UnitSystem, mm: number) => (u === "imperial" ? mmToIn(mm) : mm);
