// npm run --silent flex -- readings.csv [--rated 85] [--span-mm 1000] [--load-point-mm 500] [--ref-span-mm 1000]
// Prints the bench fit as JSON; bad input: one line on stderr and a non-zero exit.
import { readFileSync, statSync } from "node:fs";
import { parseArgs } from "node:util";
import { BENCH_LOADING_CAUTION, READINGS_LIMITS, StickLabInputError, fitBench, parseReadingsCsv } from "../../shared/mechanics/sticklab";

const USAGE = `usage: npm run --silent flex -- readings.csv [--rated FLEX] [--span-mm MM] [--load-point-mm MM] [--ref-span-mm MM]
The CSV header names its units: load_lbf,deflection_in or load_n,deflection_mm.
Caution: ${BENCH_LOADING_CAUTION}`;

function fail(message: string, code = 1): never {
  process.stderr.write(`flex: ${message.replace(/\s+/g, " ")}\n`);
  process.exit(code);
}

function positive(name: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (text.trim() === "" || !Number.isFinite(v) || v <= 0) fail(`--${name} must be a number greater than zero (got "${text}")`, 2);
  return v;
}

let args: ReturnType<typeof parse>;
function parse() {
  return parseArgs({
    allowPositionals: true,
    options: {
      rated: { type: "string" },
      "span-mm": { type: "string" },
      "load-point-mm": { type: "string" },
      "ref-span-mm": { type: "string" },
      help: { type: "boolean", short: "h" },
    },
  });
}
try {
  args = parse();
} catch (err) {
  fail(`${(err as Error).message} (try --help)`, 2);
}
if (args.values.help) {
  process.stdout.write(`${USAGE}\n`);
  process.exit(0);
}
if (args.positionals.length !== 1) fail("give exactly one readings CSV file (try --help)", 2);
const file = args.positionals[0];

try {
  const size = statSync(file).size;
  if (size > READINGS_LIMITS.maxBytes) fail(`${file} is too large: ${size} bytes (the limit is ${READINGS_LIMITS.maxBytes} bytes)`);
  const { readings } = parseReadingsCsv(readFileSync(file));
  const fit = fitBench(readings, {
    ratedFlex: positive("rated", args.values.rated) ?? null,
    spanMm: positive("span-mm", args.values["span-mm"]),
    loadPointMm: positive("load-point-mm", args.values["load-point-mm"]),
    referenceSpanMm: positive("ref-span-mm", args.values["ref-span-mm"]),
  });
  process.stdout.write(`${JSON.stringify(fit, null, 2)}\n`);
} catch (err) {
  if (err instanceof StickLabInputError) fail(`${file}: ${err.message}`);
  const code = (err as NodeJS.ErrnoException).code;
  fail(code === "ENOENT" ? `cannot read ${file}: no such file` : `cannot read ${file}: ${(err as Error).message}`);
}
