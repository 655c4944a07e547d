// npm run --silent flex -- readings.csv [--rated 85] [--span-mm 1000] [--load-point-mm 500] [--ref-span-mm 1000]
// Prints the bench fit as JSON; bad input: one line on stderr and a non-zero exit.
import { readFileSync, statSync } from "node:fs";
import { failWith, startCommand, type Fail } from "../lib/cli";
import { BENCH_LOADING_CAUTION, READINGS_LIMITS, StickLabInputError, fitBench, parseReadingsCsv } from "../../shared/mechanics/sticklab";

const USAGE = `usage: npm run --silent flex -- readings.csv [--rated FLEX] [--span-mm MM] [--load-point-mm MM] [--ref-span-mm MM]
The CSV header names its units: load_lbf,deflection_in or load_n,deflection_mm.
Caution: ${BENCH_LOADING_CAUTION}`;

const fail: Fail = failWith("flex");
const { values, input: file } = startCommand({
  fail,
  usage: USAGE,
  input: "readings CSV file",
  options: { rated: { type: "string" }, "span-mm": { type: "string" }, "load-point-mm": { type: "string" }, "ref-span-mm": { type: "string" } },
});

function positive(name: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (text.trim() === "" || !Number.isFinite(v) || v <= 0) fail(`--${name} must be a number greater than zero (got "${text}")`, 2);
  return v;
}

try {
  const size = statSync(file).size;
  if (size > READINGS_LIMITS.maxBytes) fail(`${file} is too large: ${size} bytes (the limit is ${READINGS_LIMITS.maxBytes} bytes)`);
  const { readings } = parseReadingsCsv(readFileSync(file));
  const fit = fitBench(readings, {
    ratedFlex: positive("rated", values.rated) ?? null,
    spanMm: positive("span-mm", values["span-mm"]),
    loadPointMm: positive("load-point-mm", values["load-point-mm"]),
    referenceSpanMm: positive("ref-span-mm", values["ref-span-mm"]),
  });
  process.stdout.write(`${JSON.stringify(fit, null, 2)}\n`);
} catch (err) {
  if (err instanceof StickLabInputError) fail(`${file}: ${err.message}`);
  const code = (err as NodeJS.ErrnoException).code;
  fail(code === "ENOENT" ? `cannot read ${file}: no such file` : `cannot read ${file}: ${(err as Error).message}`);
}
