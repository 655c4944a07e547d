// npm run --silent beam -- beam.json [--step-mm 5]
// beam.json: { "lengthMm", "supportsMm": [x1, x2], "loads": [{ "xMm", "forceN" }], "eiNm2"? }.
// Prints reactions, the largest moment (predicted break point), shear, deflection and stations as
// JSON; bad input: one line on stderr and a non-zero exit.
import { readFileSync, statSync } from "node:fs";
import { parseArgs } from "node:util";
import { BEAM_MODEL_NOTICE, StickLabInputError, solveBeam } from "../../shared/mechanics/sticklab";
import { beamInputSchema, describeIssues } from "../../shared/schemas/stick-lab";

const MAX_BYTES = 1_000_000;
const USAGE = `usage: npm run --silent beam -- beam.json [--step-mm MM]
beam.json: { "lengthMm", "supportsMm": [x1, x2], "loads": [{ "xMm", "forceN" }], "eiNm2"? }
${BEAM_MODEL_NOTICE}`;

function fail(message: string, code = 1): never {
  process.stderr.write(`beam: ${message.replace(/\s+/g, " ")}\n`);
  process.exit(code);
}

let args: { values: { "step-mm"?: string; help?: boolean }; positionals: string[] };
try {
  args = parseArgs({ allowPositionals: true, options: { "step-mm": { type: "string" }, help: { type: "boolean", short: "h" } } });
} catch (err) {
  fail(`${(err as Error).message} (try --help)`, 2);
}
if (args.values.help) {
  process.stdout.write(`${USAGE}\n`);
  process.exit(0);
}
if (args.positionals.length !== 1) fail("give exactly one beam JSON file (try --help)", 2);
const file = args.positionals[0];
const stepText = args.values["step-mm"];
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
