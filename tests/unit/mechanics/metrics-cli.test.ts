// `npm run --silent metrics -- shot.json` as an analyst or an integration runs it: JSON on
// stdout, or one line on stderr and a non-zero exit. Document: syntheticShot ([calc] known answers).
import { execFile } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { ShotResults, syntheticShot } from "../../../shared/mechanics/index";

const root = path.resolve(import.meta.dirname, "../../..");
const dir = mkdtempSync(path.join(tmpdir(), "metrics-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}
function run(args: string[], stdin?: string): Promise<Run> {
  return new Promise((resolve) => {
    const child = execFile("npm", ["run", "--silent", "metrics", "--", ...args], { cwd: root, maxBuffer: 32 << 20 }, (err, stdout, stderr) =>
      resolve({ code: err ? ((err as { code?: number }).code ?? 1) : 0, stdout, stderr }),
    );
    child.stdin!.end(stdin ?? "");
  });
}
const file = (name: string, text: string) => {
  const p = path.join(dir, name);
  writeFileSync(p, text);
  return p;
};
const oneLine = (r: Run, pattern: RegExp) => {
  expect(r.code).not.toBe(0);
  expect(r.stdout).toBe("");
  expect(r.stderr.trimEnd().split("\n")).toHaveLength(1);
  expect(r.stderr).toMatch(pattern);
};

const { doc, truth } = syntheticShot({ frames: 300 });

// Each run starts npm, node and tsx (about a second on a quiet machine, much more on a shared one:
// the limit only catches a hang).
describe.concurrent("metrics command", { timeout: 120_000 }, () => {
  it("prints the results of a file as JSON", async () => {
    const r = await run([file("shot.json", JSON.stringify(doc))]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const out = ShotResults.parse(JSON.parse(r.stdout));
    expect(out.puckExitSpeed.valueMps).toBeCloseTo(truth.exitSpeedMps, 6);
    expect(out.contactTimeMs).toBe(30);
    expect(out.series.puckSpeed.frame.length).toBeGreaterThan(0);
  });

  it("reads stdin with -, and leaves the series out with --no-series", async () => {
    const r = await run(["-", "--no-series", "--trials", "50"], JSON.stringify(doc));
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.series.puckSpeed.frame).toEqual([]);
    expect(out.uncertainty.trials).toBe(50);
  });

  it("invalid documents: one line naming the field", async () => {
    oneLine(await run([file("fps.json", JSON.stringify({ ...doc, captureFps: -1 }))]), /^metrics: captureFps: must be above 0/);
    oneLine(await run(["-"], "{ not json"), /^metrics: stdin is not valid JSON/);
    oneLine(await run(["-"], JSON.stringify({ ...doc, events: { ...doc.events, release: 1 } })), /^metrics: events.release: release \(frame 1\) must come after puck strike/);
  });

  it("usage errors exit 2", async () => {
    const r = await run([]);
    oneLine(r, /give exactly one shot document/);
    expect(r.code).toBe(2);
    oneLine(await run([path.join(dir, "missing.json")]), /cannot read .*missing\.json: ENOENT/);
    oneLine(await run(["-", "--trials", "3"], "{}"), /--trials must be a whole number of at least 20/);
  });
});
