// The two commands as an analyst runs them: `npm run --silent flex|beam -- FILE`. Figures are
// checked against the handbook and [CP] facts used in the engine tests.
import { execFile } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { fixture, projectRoot } from "./support";

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}
const run = (command: "flex" | "beam", args: string[]) =>
  new Promise<Run>((resolve) => {
    execFile("npm", ["run", "--silent", command, "--", ...args], { cwd: projectRoot }, (err, stdout, stderr) =>
      resolve({ code: err ? ((err as { code?: number }).code ?? 1) : 0, stdout, stderr }),
    );
  });

const dir = mkdtempSync(path.join(tmpdir(), "sticklab-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = (name: string, text: string) => {
  const p = path.join(dir, name);
  writeFileSync(p, text);
  return p;
};
const oneLineFailure = (r: Run, pattern: RegExp) => {
  expect(r.code).not.toBe(0);
  expect(r.stdout).toBe("");
  expect(r.stderr.trimEnd().split("\n")).toHaveLength(1);
  expect(r.stderr).toMatch(pattern);
};

// Each spawn starts npm, node and tsx (about half a second, more on a busy machine).
describe.concurrent("flex command", { timeout: 30_000 }, () => {
  it("[CP] 85 lbf at 1.00 in: prints 85 flex and 100 % of an 85 rating", async () => {
    const csv = file("cp85.csv", "load_lbf,deflection_in\n21.25,0.25\n42.5,0.50\n63.75,0.75\n85,1.00\n");
    const r = await run("flex", [csv, "--rated", "85"]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.stiffnessLbfPerIn).toBeCloseTo(85, 9);
    expect(out.stiffnessNPerMm).toBeCloseTo(85 * (4.4482216152605 / 25.4), 9);
    expect(out.interceptLbf).toBeCloseTo(0, 9);
    expect(out.r2).toBeCloseTo(1, 12);
    expect(out.n).toBe(4);
    expect(out.percentOfRated).toBeCloseTo(100, 9);
  });

  it("percentOfRated is null without --rated; --span-mm 500 normalises by 1/L³ (Cross & Lindsey 2016)", async () => {
    const csv = file("half-span.csv", "load_lbf,deflection_in\n68,0.1\n136,0.2\n204,0.3\n");
    const out = JSON.parse((await run("flex", [csv, "--span-mm", "500"])).stdout);
    expect(out.percentOfRated).toBeNull();
    expect(out.stiffnessLbfPerIn).toBeCloseTo(680, 9);
    expect(out.measuredFlex).toBeCloseTo(85, 9);
    expect(out.spanMm).toBe(500);
  });

  it("reads the demo used-stick file", async () => {
    const out = JSON.parse((await run("flex", [fixture("used-85-stick.csv"), "--rated", "85"])).stdout);
    expect(out.measuredFlex).toBeGreaterThan(65);
    expect(out.measuredFlex).toBeLessThan(75);
    expect(out.percentOfRated).toBeCloseTo((100 * out.measuredFlex) / 85, 9);
  });

  it("bad CSV: one line on stderr naming row and column, non-zero exit", async () => {
    const [text, units, empty] = await Promise.all([
      run("flex", [file("text.csv", "load_lbf,deflection_in\n10,0.1\nten,0.2\n30,0.3\n")]),
      run("flex", [file("units.csv", "load_kg,deflection_in\n1,1\n2,2\n3,3\n")]),
      run("flex", [file("empty.csv", "")]),
    ]);
    oneLineFailure(text, /^flex: .*text\.csv: line 3, column load_lbf: "ten" is not a number$/m);
    oneLineFailure(units, /unknown unit "kg"/);
    oneLineFailure(empty, /the file is empty/);
  });

  it("a file over the size limit is refused without reading it", async () => {
    oneLineFailure(await run("flex", [file("huge.csv", "load_n,deflection_mm\n" + "1,1\n".repeat(300_000))]), /too large: \d+ bytes/);
  });

  it("usage errors: no file, a missing file, a bad option value", async () => {
    const used = fixture("used-85-stick.csv");
    const runs = await Promise.all([
      run("flex", []),
      run("flex", [path.join(dir, "absent.csv")]),
      run("flex", [used, "--rated", "lots"]),
      run("flex", [used, "--span-mm", "1000", "--load-point-mm", "1200"]),
      run("flex", [used, "--colour"]),
    ]);
    oneLineFailure(runs[0], /give exactly one readings CSV file/);
    oneLineFailure(runs[1], /cannot read .*absent\.csv: no such file/);
    oneLineFailure(runs[2], /--rated must be a number greater than zero/);
    oneLineFailure(runs[3], /load point must lie between the supports/);
    oneLineFailure(runs[4], /Unknown option/);
  });
});

describe.concurrent("beam command", { timeout: 30_000 }, () => {
  it("the worked example, off-centre (REFERENCES.md, pickedshares.com calc)", async () => {
    const r = await run("beam", [fixture("beam-off-centre.json")]);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.reactionsN[0]).toBeCloseTo(333.3, 1);
    expect(out.reactionsN[1]).toBeCloseTo(666.7, 1);
    expect(out.maxMoment.valueNm).toBeCloseTo(666.7, 1);
    expect(out.maxMoment.xMm).toBe(2000);
    expect(Math.abs(out.maxShearN)).toBeCloseTo(666.7, 1);
    expect(out.maxDeflectionMm).toBeCloseTo(1.38, 2);
    expect(out.stations.find((s: { xMm: number }) => s.xMm === 2000).deflectionMm).toBeCloseTo(1.267, 3);
    expect(out.notice).toMatch(/not a substitute for an engineer's assessment/);
  });

  it("without EI there is no deflection; --step-mm sets the station spacing", async () => {
    const f = file("noei.json", JSON.stringify({ lengthMm: 1000, supportsMm: [0, 1000], loads: [{ xMm: 500, forceN: 100 }] }));
    const out = JSON.parse((await run("beam", [f, "--step-mm", "250"])).stdout);
    expect(out.maxDeflectionMm).toBeUndefined();
    expect(out.maxMoment.valueNm).toBeCloseTo(25, 12); // AISC case 7: FL/4
    expect(out.stations.map((s: { xMm: number }) => s.xMm)).toEqual([0, 0, 250, 500, 500, 750, 1000, 1000]);
  });

  it("bad beams: one line on stderr, non-zero exit", async () => {
    const bad = (name: string, v: unknown) => file(name, JSON.stringify(v));
    const runs = await Promise.all([
      run("beam", [bad("order.json", { lengthMm: 1000, supportsMm: [900, 100], loads: [{ xMm: 500, forceN: 1 }] })]),
      run("beam", [bad("outside.json", { lengthMm: 1000, supportsMm: [0, 1000], loads: [{ xMm: 1200, forceN: 1 }] })]),
      run("beam", [bad("ei.json", { lengthMm: 1000, supportsMm: [0, 1000], loads: [{ xMm: 500, forceN: 1 }], eiNm2: -1 })]),
      run("beam", [file("broken.json", "{ lengthMm: 1000")]),
      run("beam", [fixture("beam-off-centre.json"), "--step-mm", "0"]),
    ]);
    oneLineFailure(runs[0], /supports must be in order/);
    oneLineFailure(runs[1], /outside the stick/);
    oneLineFailure(runs[2], /eiNm2/);
    oneLineFailure(runs[3], /is not valid JSON/);
    oneLineFailure(runs[4], /--step-mm must be a number greater than zero/);
  });
});
