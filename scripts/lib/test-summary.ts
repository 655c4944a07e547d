// Adds up the suites' reports into the one closing line CI reads: "tests: N passed, N failed".
import fs from "node:fs";
import path from "node:path";

const dir = process.argv[2];
const read = (f: string) => (fs.existsSync(path.join(dir, f)) ? fs.readFileSync(path.join(dir, f), "utf8") : null);
const rows: { suite: string; passed: number; failed: number; skipped: number }[] = [];

for (const suite of ["typecheck", "lint"]) {
  const text = read(`${suite}.txt`);
  if (!text) continue;
  const m = text.match(/(\d+) passed, (\d+) failed/)!;
  rows.push({ suite, passed: +m[1], failed: +m[2], skipped: 0 });
}
const v = read("vitest.json");
if (v) {
  const j = JSON.parse(v);
  // A file whose set-up failed fails no test of its own: count it as one failure, so the line
  // never reads "0 failed" while vitest failed.
  const failedFiles = (j.testResults as { status: string; assertionResults: { status: string }[] }[])
    .filter((f) => f.status === "failed" && !f.assertionResults.some((a) => a.status === "failed")).length;
  rows.push({ suite: "vitest", passed: j.numPassedTests, failed: j.numFailedTests + failedFiles, skipped: j.numPendingTests + j.numTodoTests });
} else rows.push({ suite: "vitest", passed: 0, failed: 1, skipped: 0 });
const p = read("playwright.json");
if (p) {
  const s = JSON.parse(p).stats;
  rows.push({ suite: "playwright", passed: s.expected + s.flaky, failed: s.unexpected, skipped: s.skipped });
} else rows.push({ suite: "playwright", passed: 0, failed: 1, skipped: 0 });

for (const r of rows) console.log(`  ${r.suite.padEnd(11)} ${r.passed} passed, ${r.failed} failed, ${r.skipped} skipped`);
const t = rows.reduce((a, r) => ({ p: a.p + r.passed, f: a.f + r.failed, s: a.s + r.skipped }), { p: 0, f: 0, s: 0 });
console.log(`tests: ${t.p} passed, ${t.f} failed, ${t.s} skipped`);
process.exit(t.f > 0 ? 1 : 0);
