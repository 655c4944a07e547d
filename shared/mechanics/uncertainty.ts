import seedrandom from "seedrandom";
import { quantileSorted, sampleStandardDeviation } from "simple-statistics";

// Monte Carlo propagation of distributions (JCGM 101:2008, GUM Supplement 1): the inputs are
// perturbed by their stated uncertainties, the results recomputed, and their spread reported —
// see docs/decisions/011-uncertainty-monte-carlo.md.

/** Standard normal deviates from a seeded generator (Box–Muller on seedrandom's Alea). */
export function normalSource(seed: string): () => number {
  const uniform = seedrandom.alea(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    const th = 2 * Math.PI * uniform();
    spare = r * Math.sin(th);
    return r * Math.cos(th);
  };
}

export interface Spread {
  /** Standard uncertainty: the standard deviation of the trial results. */
  u: number;
  /** Probabilistically symmetric 95 % coverage interval. */
  interval95: [number, number];
}

/** Spread of nominal + deviation over the trials (NaN deviations, from failed trials, are dropped). */
export function spreadOf(nominal: number, deviations: number[]): Spread | null {
  const d = deviations.filter(Number.isFinite).sort((a, b) => a - b);
  if (d.length < 2) return null;
  return {
    u: sampleStandardDeviation(d),
    interval95: [nominal + quantileSorted(d, 0.025), nominal + quantileSorted(d, 0.975)],
  };
}
