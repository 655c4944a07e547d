// Benchmark of the shot mechanics engine: a synthetic shot with N marks per track (five tracks)
// through computeShot, median of several runs, and how the time grows from 1,000 to 100,000 marks.
// Baselines measured in the same run: JSON.parse of the document (work any caller already does)
// and one zero-lag filtering of every coordinate of every track (the least smoothing can cost).
// Figures only — nothing here passes or fails.
import { availableParallelism, loadavg } from "node:os";
import { performance } from "node:perf_hooks";
import { computeShot, DEFAULT_TRIALS, parseShotDocument, syntheticShot, zeroLagLowPass } from "../../shared/mechanics/index";

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Median wall time of `runs` calls after one warm-up, and the median CPU time of this process (less
 * sensitive to other programs on a busy machine). */
function time(fn: () => unknown, runs: number): { wall: number; cpu: number } {
  fn();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    fn();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { wall: median(wall), cpu: median(cpu) };
}

const sizes = [1_000, 10_000, 100_000];
type Timing = ReturnType<typeof time>;
const rows: { n: number; full: Timing; trials20: Timing; parse: Timing; json: Timing; filterOnce: Timing }[] = [];
for (const n of sizes) {
  const { doc } = syntheticShot({ frames: n, noisePx: 0.5, seed: `bench-${n}` });
  const text = JSON.stringify(doc);
  const runs = n >= 100_000 ? 7 : 21;
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

const f = (t: Timing) => `${t.wall.toFixed(2).padStart(8)} (${t.cpu.toFixed(1).padStart(6)})`;
console.log(`computeShot on synthetic shots (5 tracks, cutoff by residual analysis, ${DEFAULT_TRIALS} Monte Carlo trials)`);
console.log("median wall ms (median CPU ms of this process; a busy machine inflates the wall time)");
console.log("    marks          results         20 trials          validate        JSON.parse       filter once");
for (const r of rows) console.log(`${String(r.n).padStart(9)} ${f(r.full)} ${f(r.trials20)} ${f(r.parse)} ${f(r.json)} ${f(r.filterOnce)}`);
const at10k = rows.find((r) => r.n === 10_000)!;
console.log(`\n10,000 marks per track → results: ${at10k.full.wall.toFixed(2)} ms median wall, ${at10k.full.cpu.toFixed(1)} ms CPU (goal ≤ 20 ms)`);
// The goal that holds on any machine: the whole computation within 1.5× of parsing the same document.
const ratio = (k: "wall" | "cpu") => (at10k.full[k] / at10k.json[k]).toFixed(2);
console.log(`  results / JSON.parse of the same document: ×${ratio("wall")} wall, ×${ratio("cpu")} CPU (goal ≤ 1.5)`);
console.log(`  load average ${loadavg().map((l) => l.toFixed(2)).join(" ")} on ${availableParallelism()} cores`);
console.log("growth per decade of marks, wall (CPU) time (10 = linear):");
for (let i = 1; i < rows.length; i++) {
  const ratio = (k: "full" | "json" | "filterOnce") =>
    `×${(rows[i][k].wall / rows[i - 1][k].wall).toFixed(2)} (×${(rows[i][k].cpu / rows[i - 1][k].cpu).toFixed(2)})`;
  console.log(`  ${rows[i - 1].n} → ${rows[i].n}: results ${ratio("full")}, JSON.parse ${ratio("json")}, filter once ${ratio("filterOnce")}`);
}
