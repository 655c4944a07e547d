// 1.2.1: the puck's Monte Carlo draws its exit velocity's digitising noise as one Gaussian with the
// line fit's exact covariance (flight-trials.ts) in place of noise on every flight mark: the same
// distribution, other draws, so every stored ± moves within its Monte Carlo scatter (~3.5 %).
/** Stored with every result; bump when any result for the same document would change. */
export const ENGINE_VERSION = "mechanics-1.2.1";
