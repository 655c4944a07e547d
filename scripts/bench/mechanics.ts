// Benchmark of the shot mechanics engine: a synthetic shot with N marks per track (five tracks)
// through computeShot, median of several runs, and how the time grows from 1,000 to 100,000 marks.
// Baselines measured in the same run: JSON.parse of the document (work any caller already does)
// and one zero-lag filtering of every coordinate of every track (the least smoothing can cost).
// Figures only — nothing here passes or fails.
import { performance } from "node:perf_hooks";
import { computeShot, DEFAULT_TRIALS, parseShotDocument, syntheticShot, zeroLagLowPass } from "../../shared/mechanics/index";

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function time(fn: () => unknown, runs: number): number {
  fn();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    t.push(performance.now() - t0);
  }
  return median(t);
}

const sizes = [1_000, 10_000, 100_000];
const rows: { n: number; full: number; trials20: number; parse: number; json: number; filterOnce: number }[] = [];
for (const n of sizes) {
  const { doc } = syntheticShot({ frames: n, noisePx: 0.5, seed: `bench-${n}` });
  const text = JSON.stringify(doc);
  const runs = n >= 100_000 ? 5 : 15;
  const tracks = Object.values(doc.tracks).filter((t): t is [number, number, number][] => !!t);
  const coords = tracks.flatMap((t) => [Float64Array.from(t, (m) => m[1]), Float64Array.from(t, (m) => m[2])]);
  rows.push({
    n,
    full: time(() => computeShot(doc), runs),
    trials20: time(() => computeShot(doc, { trials: 20 }), runs),
    parse: time(() => parseShotDocument(doc), runs),
    json: time(() => JSON.parse(text), runs),
    filterOnce: time(() => coords.forEach((c) => zeroLagLowPass(c, 60, doc.captureFps)), runs),
  });
}

const f = (ms: number) => ms.toFixed(2).padStart(9);
console.log(`computeShot on synthetic shots (5 tracks, cutoff by residual analysis, ${DEFAULT_TRIALS} Monte Carlo trials); median ms`);
console.log("    marks   results  20 trials  validate  JSON.parse  filter once");
for (const r of rows) console.log(`${String(r.n).padStart(9)} ${f(r.full)}  ${f(r.trials20)} ${f(r.parse)}   ${f(r.json)}    ${f(r.filterOnce)}`);
const at10k = rows.find((r) => r.n === 10_000)!;
console.log(`\n10,000 marks per track → results: ${at10k.full.toFixed(2)} ms median (goal ≤ 20 ms)`);
console.log("growth per decade of marks (10 = linear):");
for (let i = 1; i < rows.length; i++)
  console.log(
    `  ${rows[i - 1].n} → ${rows[i].n}: results ×${(rows[i].full / rows[i - 1].full).toFixed(2)}, ` +
      `JSON.parse ×${(rows[i].json / rows[i - 1].json).toFixed(2)}, filter once ×${(rows[i].filterOnce / rows[i - 1].filterOnce).toFixed(2)}`,
  );
