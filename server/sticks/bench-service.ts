// Bench tests: readings typed into a table (JSON) or uploaded as a CSV, checked and fitted by the
// engine (shared/mechanics/sticklab), stored with the fit. Anything the engine refuses becomes
// a 422 with its message, and nothing is stored.
import { policy, type Actor } from "../auth/policy";
import { recordAudit } from "../entities/audit/repository";
import { HttpError, notFound } from "../http/problem";
import { parse } from "../http/validate";
import { READINGS_LIMITS, fitBench, parseReadingsCsv, readingsToSi, type BenchReading } from "../../shared/mechanics/sticklab";
import { BenchCsvFieldsSchema, benchTestInputSchema, type BenchEntry, type BenchTestRow } from "../../shared/schemas/sticks";
import type { BenchTest } from "../../shared/schemas/stick-lab";
import { viaEngine } from "./engine-errors";
import { presentBenchTest, type StoredFit } from "./present";
import * as repo from "../entities/stick/repository";
import { editableStick } from "./service";
import { stickStiffnessChanged } from "./stiffness";

type StickRow = NonNullable<Awaited<ReturnType<typeof repo.stickById>>>;

/** A day in the future is a typing slip; one day of slack covers time zones ahead of UTC. */
function checkNotFuture(date: string, field: string) {
  const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
  if (date > tomorrow)
    throw new HttpError(422, "validation_failed", `${field}: the test date ${date} is in the future`, [{ path: field, message: `The test date ${date} is in the future` }]);
}

async function fitAndStore(a: Actor, row: StickRow, test: BenchTest, readings: BenchReading[], entry: BenchEntry, field: string): Promise<BenchTestRow> {
  checkNotFuture(test.date, "date");
  const fit = viaEngine(
    () => fitBench(readings, { spanMm: test.spanMm, loadPointMm: test.loadPointMm, ratedFlex: row.stick.ratedFlex }),
    field,
  );
  const stored: StoredFit = { ...fit, entry };
  const created = await repo.insertBenchTest({
    teamId: a.teamId,
    stickId: row.stick.id,
    testedOn: test.date,
    spanMm: fit.spanMm,
    loadPointMm: fit.loadPointMm,
    readings,
    fit: stored,
    measuredFlex: fit.measuredFlex,
    eiNm2: fit.eiNm2,
    createdBy: a.userId,
  });
  await stickStiffnessChanged(a.teamId, row.stick.id);
  const withName = await repo.benchTestById(a.teamId, row.stick.id, created.id);
  return presentBenchTest(created, row.stick.ratedFlex, withName?.createdByName ?? null);
}

/** Readings typed into the table: `{ date, spanMm?, loadPointMm?, loadUnit, deflectionUnit, readings: [{ load, deflection }] }`. */
export async function addBenchTest(a: Actor, stickId: string, body: unknown): Promise<BenchTestRow> {
  const row = await editableStick(a, stickId, policy.runBenchTest);
  const test = parse(benchTestInputSchema, body);
  const units = { load: test.loadUnit, deflection: test.deflectionUnit };
  const readings = viaEngine(() => readingsToSi(test.readings, units), "readings");
  return fitAndStore(a, row, test, readings, { source: "table", loadUnit: test.loadUnit, deflectionUnit: test.deflectionUnit }, "readings");
}

export interface UploadedCsv {
  buffer: Buffer;
  originalname: string;
  size: number;
}

/** A readings CSV (header `load_lbf,deflection_in` or `load_n,deflection_mm`) with the test's date, span and load point as fields. */
export async function addBenchTestCsv(a: Actor, stickId: string, file: UploadedCsv | undefined, fields: Record<string, unknown>): Promise<BenchTestRow> {
  const row = await editableStick(a, stickId, policy.runBenchTest);
  const meta = parse(BenchCsvFieldsSchema, fields);
  if (!file)
    throw new HttpError(422, "validation_failed", "file: attach the readings as a CSV file in the field \"file\"", [
      { path: "file", message: "Attach the readings as a CSV file" },
    ]);
  if (file.size > READINGS_LIMITS.maxBytes) throw csvTooLarge(file.size);
  const parsed = viaEngine(() => parseReadingsCsv(file.buffer), "file");
  const test = parse(benchTestInputSchema, {
    date: meta.date,
    ...(meta.spanMm !== undefined ? { spanMm: meta.spanMm } : {}),
    ...(meta.loadPointMm !== undefined ? { loadPointMm: meta.loadPointMm } : {}),
    loadUnit: parsed.units.load,
    deflectionUnit: parsed.units.deflection,
    readings: parsed.raw,
  });
  const entry: BenchEntry = { source: "csv", loadUnit: parsed.units.load, deflectionUnit: parsed.units.deflection, fileName: file.originalname.slice(0, 200) };
  return fitAndStore(a, row, test, parsed.readings, entry, "file");
}

/** The engine's own wording for a file over the limit, for uploads the server stops reading early. */
export function csvTooLarge(size: number | null): HttpError {
  const got = size === null ? `more than ${READINGS_LIMITS.maxBytes} bytes` : `${size} bytes`;
  const message = `the file is too large: ${got} (the limit is ${READINGS_LIMITS.maxBytes} bytes)`;
  return new HttpError(422, "validation_failed", message, [{ path: "file", message }]);
}

export async function deleteBenchTest(a: Actor, stickId: string, testId: string): Promise<void> {
  const row = await editableStick(a, stickId, policy.runBenchTest);
  const found = await repo.benchTestById(a.teamId, stickId, testId);
  if (!found) throw notFound("That bench test");
  await repo.deleteBenchTest(a.teamId, testId);
  await recordAudit({
    teamId: a.teamId,
    actorId: a.userId,
    action: "bench_test.deleted",
    targetType: "bench_test",
    targetId: testId,
    detail: { stickId, stickLabel: row.stick.label, testedOn: found.test.testedOn, measuredFlex: found.test.measuredFlex },
  });
  await stickStiffnessChanged(a.teamId, stickId);
}
