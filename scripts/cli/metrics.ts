// npm run --silent metrics -- shot.json [--trials N] [--seed TEXT] [--no-series]
// Reads a shot document (a file, or - for stdin), prints the results as JSON on stdout.
// Bad input: one line on stderr and a non-zero exit (2 for usage, 1 for the document).
import { readFileSync } from "node:fs";
import { parseArgs } from "node:util";
import { computeShot, DEFAULT_TRIALS, isMechanicsInputError } from "../../shared/mechanics/index";

const USAGE = `usage: npm run --silent metrics -- shot.json|- [--trials N] [--seed TEXT] [--no-series]
The document: { captureFps, calibration, pixelErrorPx?, calibrationErrorRel?, cutoffHz?, frameRange?,
frameCount?, tracks: { puck, bladeHeel?, bladeToe?, bottomHand?, topHand? }, events, stick? }.
--trials  Monte Carlo trials for the uncertainties (default ${DEFAULT_TRIALS}, at least 20)
--seed    seed of the trials (same document and seed, same results)
--no-series  leave the time series out`;

function fail(message: string, code = 1): never {
  process.stderr.write(`metrics: ${message.replace(/\s+/g, " ").trim()}\n`);
  process.exit(code);
}

function parse() {
  return parseArgs({
    allowPositionals: true,
    options: {
      trials: { type: "string" },
      seed: { type: "string" },
      "no-series": { type: "boolean" },
      help: { type: "boolean", short: "h" },
    },
  });
}

let args: ReturnType<typeof parse>;
try {
  args = parse();
} catch (err) {
  fail(`${(err as Error).message} (try --help)`, 2);
}
if (args.values.help) {
  process.stdout.write(`${USAGE}\n`);
  process.exit(0);
}
if (args.positionals.length !== 1) fail("give exactly one shot document: a JSON file, or - for stdin (try --help)", 2);
const source = args.positionals[0];
const trialsText = args.values.trials;
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
  const results = computeShot(doc, { trials, seed: args.values.seed, series: !args.values["no-series"] });
  process.stdout.write(`${JSON.stringify(results, null, 2)}\n`);
} catch (err) {
  if (isMechanicsInputError(err)) fail(err.message);
  throw err;
}
