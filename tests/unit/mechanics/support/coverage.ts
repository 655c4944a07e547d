// Seeded coverage runs for the engine's 95 % intervals. A run makes many noisy copies of the
// synthetic shot (syntheticShot: [calc] closed-form motion, so every truth is known), computes each
// with the engine, and counts how often each result's interval holds the truth. Coverage interval:
// JCGM 101:2008 (GUM Supplement 1) [P]. [calc] At a true 95 %, fewer than 93 % of 240 copies happens
// with probability ≈ 7 % (binomial); the engine aims above 95 % where it can.
import { describe, expect, it } from "vitest";
import { computeShot, normalSource, syntheticShot, uniformSource, type ShotDocumentInput, type SyntheticShotOptions } from "../../../../shared/mechanics/index";

export const RESULTS = ["puck exit speed", "blade speed at strike", "peak bend", "shaft deflection", "stored energy"] as const;
export type ResultName = (typeof RESULTS)[number];

export interface CoverageConfig {
  name: string;
  shot: SyntheticShotOptions;
  /** True event instants drawn uniformly within ±½ frame of the marked frames. */
  eventsBetweenFrames?: boolean;
  /** Scale-bar length off by this relative standard deviation, and stated so. */
  scaleErrorRel?: number;
  /** Marking noise stated to the engine (defaults to the true noise). */
  statedPixelErrorPx?: number;
}

export interface CoverageRow {
  config: string;
  repeats: number;
  /** Share of copies whose interval held the truth, per result. */
  coverage: Record<ResultName, number>;
  /** Mean stated standard uncertainty, per result. */
  meanU: Record<ResultName, number>;
  msPerShot: number;
}

/**
 * Monte Carlo trials per copy. Fewer than the engine's 400: fewer trials only make each stated
 * interval noisier, and a noisier interval covers less often (coverage is concave in the
 * interval's width near 95 %), so a pass here is a pass at 400 too; it halves the test's time.
 */
export const COVERAGE_TRIALS = 200;

export function runCoverage(c: CoverageConfig, repeats: number, trials = COVERAGE_TRIALS): CoverageRow {
  const hits = Object.fromEntries(RESULTS.map((r) => [r, 0])) as Record<ResultName, number>;
  const uSum = Object.fromEntries(RESULTS.map((r) => [r, 0])) as Record<ResultName, number>;
  const draw = normalSource(`coverage:${c.name}`);
  const phase = uniformSource(`coverage-events:${c.name}`);
  const uniform = () => phase() - 0.5;
  const t0 = performance.now();
  for (let i = 0; i < repeats; i++) {
    const eventPhase = c.eventsBetweenFrames ? { iceStrike: uniform(), puckStrike: uniform(), release: uniform() } : undefined;
    const { doc, truth } = syntheticShot({ ...c.shot, eventPhase, seed: `coverage:${c.name}:${i}` });
    const d: ShotDocumentInput = { ...doc };
    if (c.scaleErrorRel && d.calibration.type === "scaleBar") {
      d.calibration = { ...d.calibration, lengthMm: d.calibration.lengthMm! * (1 + c.scaleErrorRel * draw()) };
      d.calibrationErrorRel = c.scaleErrorRel;
    }
    if (c.statedPixelErrorPx !== undefined) d.pixelErrorPx = c.statedPixelErrorPx;
    const r = computeShot(d, { trials, series: false });
    const check = (name: ResultName, v: { u: number | null | undefined; iv: [number, number] | null | undefined } | null, t: number | null) => {
      if (!v || !v.iv || t === null) throw new Error(`${c.name}: no ${name} for copy ${i}`);
      if (v.iv[0] <= t && t <= v.iv[1]) hits[name]++;
      uSum[name] += v.u ?? NaN;
    };
    const b = r.bladeSpeedAtStrike;
    const p = r.peakBend;
    const dd = r.shaftDeflection;
    const e = r.storedEnergy;
    check("puck exit speed", { u: r.puckExitSpeed.uncertaintyMps, iv: r.puckExitSpeed.interval95Mps }, truth.exitSpeedMps);
    check("blade speed at strike", b && { u: b.uncertaintyMps, iv: b.interval95Mps }, truth.bladeSpeedAtStrikeMps);
    check("peak bend", p && { u: p.uncertaintyDeg, iv: p.interval95Deg }, truth.peakBendDeg);
    check("shaft deflection", dd && { u: dd.uncertaintyMm, iv: dd.interval95Mm }, truth.peakDeflectionMm);
    check("stored energy", e && { u: e.uncertaintyJ, iv: e.interval95J }, truth.storedEnergyJ);
  }
  const ms = (performance.now() - t0) / repeats;
  const per = (o: Record<ResultName, number>) => Object.fromEntries(RESULTS.map((r) => [r, o[r] / repeats])) as Record<ResultName, number>;
  return { config: c.name, repeats, coverage: per(hits), meanU: per(uSum), msPerShot: ms };
}

/** The coverage table, one line per configuration. */
export function coverageTable(rows: CoverageRow[]): string {
  const head = ["configuration", "copies", ...RESULTS, "ms/shot"];
  const lines = rows.map((r) => [r.config, String(r.repeats), ...RESULTS.map((k) => `${(100 * r.coverage[k]).toFixed(1)} %`), r.msPerShot.toFixed(0)]);
  const widths = head.map((h, i) => Math.max(h.length, ...lines.map((l) => l[i].length)));
  const fmt = (cells: string[]) => `| ${cells.map((c, i) => (i < 2 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join(" | ")} |`;
  return [fmt(head), `|${widths.map((w) => "-".repeat(w + 2)).join("|")}|`, ...lines.map(fmt)].join("\n");
}

/** Copies per configuration: at a true 95 %, fewer than 93 % of 240 happens with probability ≈ 7 %. */
export const COPIES = 240;

/** One suite per capture rate: runs every configuration, prints the table, one test per configuration. */
export function describeCoverage(title: string, configs: CoverageConfig[], more?: () => void): void {
  describe(title, { timeout: 300_000 }, () => {
    const rows = configs.map((c) => runCoverage(c, COPIES));
    console.log(`\n${coverageTable(rows)}\n`);
    for (const row of rows)
      it(`${row.config}: every result ≥ 93 %`, () => {
        for (const r of RESULTS) expect({ result: r, coverage: row.coverage[r] }).toEqual({ result: r, coverage: expect.toSatisfy((v: number) => v >= 0.93) });
      });
    more?.();
  });
}
