// npm run --silent beam -- beam.json [--step-mm 5]
// beam.json: { "lengthMm", "supportsMm": [x1, x2], "loads": [{ "xMm", "forceN" }], "eiNm2"? }.
// Prints reactions, the largest moment (predicted break point), shear, deflection and stations as
// JSON; bad input: one line on stderr and a non-zero exit.
import { readFileSync, statSync } from "node:fs";
import { failWith, startCommand, type Fail } from "../lib/cli";
import { BEAM_MODEL_NOTICE, StickLabInputError, solveBeam } from "../../shared/mechanics/sticklab";
import { beamInputSchema, describeIssues } from "../../shared/schemas/stick-lab";

const MAX_BYTES = 1_000_000;
const USAGE = `usage: npm run --silent beam -- beam.json [--step-mm MM]
beam.json: { "lengthMm", "supportsMm": [x1, x2], "loads": [{ "xMm", "forceN" }], "eiNm2"? }
${BEAM_MODEL_NOTICE}`;

const fail: Fail = failWith("beam");
const { values, input: file } = startCommand({ fail, usage: USAGE, input: "beam JSON file", options: { "step-mm": { type: "string" } } });
const stepText = values["step-mm"];
const stepMm = stepText === undefined ? undefined : Number(stepText);
if (stepMm !== undefined && (stepText!.trim() === "" || !(stepMm > 0) || !Number.isFinite(stepMm)))
  fail(`--step-mm must be a number greater than zero (got "${stepText}")`, 2);

let json: unknown;
try {
  const size = statSync(file).size;
  if (size > MAX_BYTES) fail(`${file} is too large: ${size} bytes (the limit is ${MAX_BYTES} bytes)`);
  json = JSON.parse(readFileSync(file, "utf8"));
} catch (err) {
  const code = (err as NodeJS.ErrnoException).code;
  if (code === "ENOENT") fail(`cannot read ${file}: no such file`);
  fail(err instanceof SyntaxError ? `${file} is not valid JSON: ${err.message}` : `cannot read ${file}: ${(err as Error).message}`);
}
const parsed = beamInputSchema.safeParse(json);
if (!parsed.success) fail(`${file}: ${describeIssues(parsed.error)}`);
try {
  const result = solveBeam(parsed.data, { stepMm });
  process.stdout.write(`${JSON.stringify({ ...result, notice: BEAM_MODEL_NOTICE }, null, 2)}\n`);
} catch (err) {
  if (err instanceof StickLabInputError) fail(`${file}: ${err.message}`);
  throw err;
}
