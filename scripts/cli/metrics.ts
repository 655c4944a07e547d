// npm run --silent metrics -- shot.json [--trials N] [--seed TEXT] [--no-series]
// Reads a shot document (a file, or - for stdin), prints the results as JSON on stdout.
// Bad input: one line on stderr and a non-zero exit (2 for usage, 1 for the document).
import { readFileSync } from "node:fs";
import { failWith, startCommand, type Fail } from "../lib/cli";
import { computeShot, DEFAULT_TRIALS, isMechanicsInputError } from "../../shared/mechanics/index";

const USAGE = `usage: npm run --silent metrics -- shot.json|- [--trials N] [--seed TEXT] [--no-series]
The document: { captureFps, calibration, pixelErrorPx?, calibrationErrorRel?, cutoffHz?, frameRange?,
frameCount?, tracks: { puck, bladeHeel?, bladeToe?, bottomHand?, topHand? }, events, stick? }.
--trials  Monte Carlo trials for the uncertainties (default ${DEFAULT_TRIALS}, at least 20)
--seed    seed of the trials (default: from the document; same document and seed, same results)
--no-series  leave the time series out`;

const fail: Fail = failWith("metrics");
const { values, input: source } = startCommand({
  fail,
  usage: USAGE,
  input: "shot document: a JSON file, or - for stdin",
  options: { trials: { type: "string" }, seed: { type: "string" }, "no-series": { type: "boolean" } },
});
const trialsText = values.trials;
const trials = trialsText === undefined ? undefined : Number(trialsText);
if (trials !== undefined && !(Number.isInteger(trials) && trials >= 20)) fail(`--trials must be a whole number of at least 20 (got "${trialsText}")`, 2);

let text: string;
try {
  text = readFileSync(source === "-" ? 0 : source, "utf8");
} catch (err) {
  fail(`cannot read ${source === "-" ? "stdin" : source}: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`);
}

let doc: unknown;
try {
  doc = JSON.parse(text);
} catch (err) {
  fail(`${source === "-" ? "stdin" : source} is not valid JSON: ${(err as Error).message}`);
}

try {
  const results = computeShot(doc, { trials, seed: values.seed, series: !values["no-series"] });
  process.stdout.write(`${JSON.stringify(results, null, 2)}\n`);
} catch (err) {
  if (isMechanicsInputError(err)) fail(err.message);
  throw err;
}
