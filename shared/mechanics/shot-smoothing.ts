import type { SegmentLabel } from "../schemas/shot-results";
import { maxWantedCutoff } from "./butterworth";
import { MechanicsInputError } from "./errors";
import { residualAnalysisCutoff, type ResidualSeries } from "./residual-analysis";
import type { Source } from "./sources";
import type { GridSegment } from "./track-smoothing";

// Per-source smoothing: where the track is cut and which cutoff it gets.

export type CutoffMode = "auto" | "raw" | number;

export interface Cuts {
  splits: number[];
  labels: SegmentLabel[];
}

/** The puck is also cut at release (contact force ends there); stick landmarks at puck strike only. */
export function cutsFor(key: Source["key"], puckStrike: number, release: number): Cuts {
  return key === "puck"
    ? { splits: [puckStrike, release], labels: ["beforeStrike", "contact", "afterRelease"] }
    : { splits: [puckStrike], labels: ["beforeStrike", "afterStrike"] };
}

/** Residual analysis looks at the samples nearest puck strike, where the results are measured. */
export const RESIDUAL_CAP = 1024;

function residualSeries(grids: GridSegment[]): ResidualSeries[] {
  const out: ResidualSeries[] = [];
  for (const g of grids) {
    const n = g.x.length;
    const [a, b] = n <= RESIDUAL_CAP ? [0, n] : g.label === "beforeStrike" ? [n - RESIDUAL_CAP, n] : [0, RESIDUAL_CAP];
    out.push({ fsHz: g.fsHz, values: g.x.subarray(a, b) }, { fsHz: g.fsHz, values: g.y.subarray(a, b) });
  }
  return out;
}

/** Cutoff for one source: analyst's (checked against each segment's Nyquist rate), residual analysis, or raw. */
export function chooseCutoff(grids: GridSegment[], mode: CutoffMode, name: string): { cutoffHz: number | null; tooFew: boolean } {
  if (mode === "raw") return { cutoffHz: null, tooFew: false };
  if (typeof mode === "number") {
    for (const g of grids) {
      const max = maxWantedCutoff(g.fsHz);
      if (g.x.length >= 3 && mode > max)
        throw new MechanicsInputError(
          ["cutoffHz"],
          `${mode} Hz is too high for ${name} marked ${g.step > 1 ? `every ${g.step} frames` : "on every frame"} (${g.fsHz} Hz): use at most ${max.toFixed(1)} Hz`,
        );
    }
    return { cutoffHz: mode, tooFew: false };
  }
  const choice = residualAnalysisCutoff(residualSeries(grids));
  return choice ? { cutoffHz: choice.cutoffHz, tooFew: false } : { cutoffHz: null, tooFew: true };
}
