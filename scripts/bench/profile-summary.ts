// Sums a V8 CPU profile's self time by package or source file and by function, optionally only
// over a time window (the "profile window" lines bench:load prints with BENCH_CPU_PROF), e.g.
//   node --import tsx scripts/bench/profile-summary.ts web.cpuprofile 123-456 [top]
// so two profiles (bare Express's and a route's) can be compared item by item, per request.
import { readFileSync } from "node:fs";

interface Node { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] }
interface Profile { nodes: Node[]; startTime: number; samples: number[]; timeDeltas: number[] }

const [file, window, topArg, requestsArg] = process.argv.slice(2);
if (!file) {
  console.error("usage: profile-summary.ts <file.cpuprofile> [from-to µs] [top] [requests]");
  process.exit(2);
}
const p = JSON.parse(readFileSync(file, "utf8")) as Profile;
const [from, to] = window ? window.split("-").map(Number) : [-Infinity, Infinity];
const top = Number(topArg ?? 30);
const requests = Number(requestsArg ?? 0);
const byId = new Map(p.nodes.map((n) => [n.id, n]));

/** Where a frame's code lives: the package for node_modules, the project's file, or V8's own name. */
function place(n: Node): string {
  const url = n.callFrame.url;
  if (!url) return n.callFrame.functionName.startsWith("(") ? n.callFrame.functionName : "(native)";
  const pkg = /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url);
  if (pkg) return pkg[1];
  if (url.startsWith("node:")) return url;
  return url.replace(/^file:\/\//, "").replace(/^.*?\/(server|shared|scripts)\//, "$1/");
}

const selfMs = new Map<number, number>();
let t = p.startTime;
let totalMs = 0;
// A sample's time delta is the time until it was taken; counted against the sample (V8's convention).
for (let i = 0; i < p.samples.length; i++) {
  const dt = p.timeDeltas[i] ?? 0;
  t += dt;
  if (t < from || t > to) continue;
  selfMs.set(p.samples[i], (selfMs.get(p.samples[i]) ?? 0) + dt / 1000);
  totalMs += dt / 1000;
}

const sum = (key: (n: Node) => string) => {
  const m = new Map<string, number>();
  for (const [id, ms] of selfMs) {
    const k = key(byId.get(id)!);
    m.set(k, (m.get(k) ?? 0) + ms);
  }
  return [...m].sort((a, b) => b[1] - a[1]);
};
const per = (ms: number) => (requests ? `  ${((ms / requests) * 1000).toFixed(0).padStart(5)} µs/req` : "");
const show = (title: string, rows: [string, number][]) => {
  console.log(`\n${title}`);
  for (const [k, ms] of rows.slice(0, top)) console.log(`${ms.toFixed(1).padStart(9)} ms ${((100 * ms) / totalMs).toFixed(1).padStart(5)} %${per(ms)}  ${k}`);
};
const busy = totalMs - (sum(place).find(([k]) => k === "(idle)")?.[1] ?? 0);
console.log(`${file}: ${totalMs.toFixed(0)} ms sampled, ${busy.toFixed(0)} ms busy${per(busy)}`);
show("self time by package or file", sum(place));
show("self time by function", sum((n) => `${n.callFrame.functionName || "(anonymous)"} ${place(n)}:${n.callFrame.lineNumber + 1}`));
