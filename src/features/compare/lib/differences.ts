// What differs between two shots, in words a player reads at a glance ("A loaded the stick 4.1 ms
// longer"), and whether the difference is larger than the measurement can tell apart.
import { METRICS, convert, digitsOf, unitOf, type MetricDef, type MetricKey } from "@shared/schemas/readout";
import type { ShotResults } from "@shared/schemas/shot-results";
import type { UnitSystem } from "@shared/units";

export type Side = "a" | "b";

export interface Difference {
  key: MetricKey;
  label: string;
  a: { value: number; u: number | null } | null;
  b: { value: number; u: number | null } | null;
  /** b − a in SI; null when either is missing. */
  diff: number | null;
  /** The difference is more than twice the combined standard uncertainty. */
  clear: boolean;
  /** Which shot had more of this (longer load, quicker release, faster puck …); null when not clear. */
  winner: Side | null;
  /** "Shot A loaded the stick 4.1 ms longer", or why no verdict. */
  sentence: string;
}

const phrase: Record<MetricKey, (who: string, amount: string, more: boolean) => string> = {
  puckExitSpeed: (w, x, more) => `${w}'s puck left ${x} ${more ? "faster" : "slower"}`,
  bladeSpeedAtStrike: (w, x, more) => `${w}'s blade was ${x} ${more ? "faster" : "slower"} at puck strike`,
  peakBend: (w, x, more) => `${w} bent the stick ${x} ${more ? "more" : "less"}`,
  loadTime: (w, x, more) => `${w} loaded the stick ${x} ${more ? "longer" : "shorter"}`,
  contactTime: (w, x, more) => (more ? `${w} held the puck ${x} longer` : `${w} released ${x} sooner`),
  storedEnergy: (w, x, more) => `${w} stored ${x} ${more ? "more" : "less"} energy in the shaft`,
};

const sameWords: Record<MetricKey, string> = {
  puckExitSpeed: "Puck exit speed about the same",
  bladeSpeedAtStrike: "Blade speed at strike about the same",
  peakBend: "Peak bend about the same",
  loadTime: "Load time about the same",
  contactTime: "Release about as quick",
  storedEnergy: "Stored energy about the same",
};

export function difference(m: MetricDef, ra: ShotResults | null, rb: ShotResults | null, units: UnitSystem, names: Record<Side, string>): Difference {
  const a = ra ? m.read(ra) : null;
  const b = rb ? m.read(rb) : null;
  const base = { key: m.key, label: m.label, a, b };
  if (!a || !b) {
    const missing = !a && !b ? "either shot" : !a ? names.a : names.b;
    return { ...base, diff: null, clear: false, winner: null, sentence: `Not available for ${missing}` };
  }
  const diff = b.value - a.value;
  const u = Math.hypot(a.u ?? 0, b.u ?? 0);
  const clear = Math.abs(diff) > 2 * u && diff !== 0;
  const amount = `${Math.abs(convert(m.kind, diff, units)).toFixed(digitsOf(m.kind, units))}${unitOf(m.kind, units) === "°" ? "°" : ` ${unitOf(m.kind, units)}`}`;
  if (!clear) return { ...base, diff, clear, winner: null, sentence: `${sameWords[m.key]} (within the measurement)` };
  // State it from the side that "wins" in this result's own sense (quickest release = less contact).
  const bigger: Side = diff > 0 ? "b" : "a";
  const winner: Side = m.best === "max" ? bigger : bigger === "a" ? "b" : "a";
  const more = m.best === "max";
  return { ...base, diff, clear, winner, sentence: phrase[m.key](names[winner], amount, more) };
}

export function differences(ra: ShotResults | null, rb: ShotResults | null, units: UnitSystem, names: Record<Side, string>): Difference[] {
  return METRICS.map((m) => difference(m, ra, rb, units, names));
}
