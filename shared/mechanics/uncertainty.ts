import seedrandom from "seedrandom";
import { quantileSorted, sampleStandardDeviation } from "simple-statistics";
import { hypot } from "./hypot";

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

/**
 * A 32-bit FNV-1a hash of numbers (their IEEE-754 bits), in base 36. The engine seeds each
 * document's trials with it: the same document gives the same results on the server and in the
 * browser, while two shots do not share one set of draws — with one fixed seed for every shot, that
 * set's own sampling error (±3.5 % in u at 400 trials) was the same error in every shot's u.
 */
export function hashNumbers(groups: ArrayLike<number>[]): string {
  let h = 0x811c9dc5;
  const f = new Float64Array(1);
  const w = new Uint32Array(f.buffer);
  for (const g of groups) {
    if (g instanceof Float64Array) {
      // The same bits read straight from the array (the tracks' coordinates: most of the numbers).
      const words = new Uint32Array(g.buffer, g.byteOffset, 2 * g.length);
      for (let i = 0; i < words.length; i++) h = Math.imul(h ^ words[i], 0x01000193);
      continue;
    }
    for (let i = 0; i < g.length; i++) {
      f[0] = g[i];
      h = Math.imul(h ^ w[0], 0x01000193);
      h = Math.imul(h ^ w[1], 0x01000193);
    }
  }
  return (h >>> 0).toString(36);
}

/** Uniform deviates in [0, 1) from a seeded generator (seedrandom's Alea). */
export function uniformSource(seed: string): () => number {
  return seedrandom.alea(seed);
}

export interface Spread {
  /** Standard uncertainty: the standard deviation of the trial results. */
  u: number;
  /** Probabilistically symmetric 95 % coverage interval. */
  interval95: [number, number];
}

/** Coverage factor below which neither side of the interval may fall (GUM 6.3.3: k = 2 for about 95 %). */
export const MIN_COVERAGE_FACTOR = 2;

/**
 * Spread of nominal + deviation over the trials (NaN deviations, from failed trials, are dropped).
 * - The interval is the trials' 2.5 % and 97.5 % points (JCGM 101:2008, 7.7), each side widened
 *   where it is narrower than 2u: with a few hundred trials those points rest on about ten trials
 *   each and scatter by some ±7 % (JCGM 101 7.9 asks for far more trials for stable end points);
 *   the standard deviation is steadier, and k = 2 is the conventional ≈95 % (GUM 6.3.3).
 * - `bias`: an estimated bias of the nominal value (nominal − truth) that was not corrected, known
 *   only roughly (its size rests on a model of how it scales). It is added to u in quadrature and
 *   to both half-widths, U = k·u + |b| (Phillips, Eberhardt & Parry, J Res Natl Inst Stand Technol
 *   102:577–585, 1997).
 */
export function spreadOf(nominal: number, deviations: number[], bias = 0): Spread | null {
  // A typed array sorts numbers natively (no comparator call per comparison); the same order.
  const d = Array.from(Float64Array.from(deviations.filter(Number.isFinite)).sort());
  if (d.length < 2) return null;
  const uTrials = sampleStandardDeviation(d);
  const floor = MIN_COVERAGE_FACTOR * uTrials;
  const b = Math.abs(bias);
  return {
    u: hypot(uTrials, bias),
    interval95: [nominal + Math.min(quantileSorted(d, 0.025), -floor) - b, nominal + Math.max(quantileSorted(d, 0.975), floor) + b],
  };
}
