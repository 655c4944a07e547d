// Bench-test readings: a CSV (or a typed-in table) of load and deflection, checked and turned into
// SI (N, mm). The header names the units, e.g. `load_lbf,deflection_in` or `load_n,deflection_mm`.
// csv-parse's browser build is used so the same parser runs in the page and in Node (its Node
// build needs the Buffer global).
import { parse } from "csv-parse/browser/esm/sync";
import { inToMm, lbfToN } from "../units";
import { StickLabInputError } from "./sticklab-error";

export type LoadUnit = "lbf" | "N";
export type DeflectionUnit = "in" | "mm";
export interface ReadingUnits {
  load: LoadUnit;
  deflection: DeflectionUnit;
}

/** One reading as entered, in the units the analyst used. */
export interface RawReading {
  load: number;
  deflection: number;
}

/** One reading in SI. */
export interface BenchReading {
  loadN: number;
  deflectionMm: number;
}

export interface ParsedReadings {
  units: ReadingUnits;
  raw: RawReading[];
  readings: BenchReading[];
  /** File line (header = 1) of each reading, for messages that point back at the file. */
  lines: number[];
}

export const READINGS_LIMITS = { maxBytes: 1_000_000, maxRows: 10_000, minRows: 3 } as const;

const LOAD_UNITS: Record<string, LoadUnit> = { lbf: "lbf", n: "N" };
const DEFLECTION_UNITS: Record<string, DeflectionUnit> = { in: "in", mm: "mm" };
// Plain decimal or exponent notation only: Number() would also take "", "0x1f" and "Infinity".
const NUMBER_CELL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

const fail = (message: string, row?: number, field?: string): never => {
  throw new StickLabInputError(message, { row, field });
};

interface ReadingsProblem {
  message: string;
  /** Index into the readings, when one reading is at fault. */
  index?: number;
}

function findReadingsProblem(raw: readonly RawReading[], units: ReadingUnits, name: (i: number) => string): ReadingsProblem | null {
  if (raw.length < READINGS_LIMITS.minRows)
    return { message: `need at least ${READINGS_LIMITS.minRows} readings to fit a line, got ${raw.length}` };
  if (raw.length > READINGS_LIMITS.maxRows)
    return { message: `too many readings: ${raw.length} (the limit is ${READINGS_LIMITS.maxRows})` };
  for (let index = 0; index < raw.length; index++) {
    const { load, deflection } = raw[index];
    const at = (message: string) => ({ message: `${name(index)}: ${message}`, index });
    if (!Number.isFinite(load)) return at("load is not a number");
    if (!Number.isFinite(deflection)) return at("deflection is not a number");
    if (load <= 0) return at(`load must be greater than zero (got ${load} ${units.load})`);
    if (deflection < 0)
      return at(`deflection must not be negative (got ${deflection} ${units.deflection}); measure it from the unloaded shaft`);
  }
  if (raw.every((r) => r.load === raw[0].load))
    return { message: `all loads are equal (${raw[0].load} ${units.load}): use at least two different loads` };
  if (raw.every((r) => r.deflection === raw[0].deflection))
    return { message: `all deflections are equal (${raw[0].deflection} ${units.deflection}): the readings show no bending` };
  return null;
}

/** The first problem with readings typed into a table (rows numbered from 1), or null when they can be fitted. */
export function readingsProblem(raw: readonly RawReading[], units: ReadingUnits): string | null {
  return findReadingsProblem(raw, units, (i) => `row ${i + 1}`)?.message ?? null;
}

/**
 * Check readings and convert them to SI; throws StickLabInputError. `lines` names each reading
 * by its file line in messages; without it readings are table rows numbered from 1.
 */
export function readingsToSi(raw: readonly RawReading[], units: ReadingUnits, lines?: readonly number[]): BenchReading[] {
  const name = lines ? (i: number) => `line ${lines[i]}` : (i: number) => `row ${i + 1}`;
  const problem = findReadingsProblem(raw, units, name);
  if (problem) {
    const row = problem.index === undefined ? undefined : lines ? lines[problem.index] : problem.index + 1;
    fail(problem.message, row);
  }
  const toN = units.load === "lbf" ? lbfToN : (v: number) => v;
  const toMm = units.deflection === "in" ? inToMm : (v: number) => v;
  return raw.map((r) => ({ loadN: toN(r.load), deflectionMm: toMm(r.deflection) }));
}

interface Column<U> {
  index: number;
  name: string;
  unit: U;
}

function findColumn<U>(header: string[], quantity: string, known: Record<string, U>): Column<U> {
  const accepted = Object.keys(known).map((u) => `${quantity}_${u}`).join(" or ");
  const found = header.flatMap((name, index) => (name.startsWith(`${quantity}_`) || name === quantity ? [{ name, index }] : []));
  if (found.length === 0) return fail(`missing column ${accepted} (header: ${header.join(",")})`, 1, quantity);
  if (found.length > 1) return fail(`more than one ${quantity} column (${found.map((f) => f.name).join(", ")}): keep one`, 1, quantity);
  const { name, index } = found[0];
  const unit = known[name.slice(quantity.length + 1)];
  if (unit === undefined)
    return fail(`column "${name}": unknown unit "${name.slice(quantity.length + 1) || "(none)"}"; use ${accepted}`, 1, quantity);
  return { index, name, unit };
}

function numberCell(cell: string | undefined, line: number, column: string): number {
  const text = (cell ?? "").trim();
  if (text === "") return fail(`line ${line}, column ${column}: empty cell`, line, column);
  if (!NUMBER_CELL.test(text)) return fail(`line ${line}, column ${column}: "${text.slice(0, 40)}" is not a number`, line, column);
  return Number(text);
}

function byteLength(input: string | Uint8Array): number {
  if (typeof input !== "string") return input.byteLength;
  // A string's UTF-8 size is at least its length; only encode when that is not already decisive.
  return input.length > READINGS_LIMITS.maxBytes ? input.length : new TextEncoder().encode(input).byteLength;
}

/**
 * Parse a readings CSV. Messages name file lines (header = line 1) and columns. Extra columns (e.g. a
 * note) are ignored; lines starting with # are comments. Throws StickLabInputError.
 */
export function parseReadingsCsv(input: string | Uint8Array): ParsedReadings {
  const size = byteLength(input);
  if (size > READINGS_LIMITS.maxBytes)
    fail(`the file is too large: ${size} bytes (the limit is ${READINGS_LIMITS.maxBytes} bytes)`);
  const text = typeof input === "string" ? input : new TextDecoder("utf-8").decode(input);
  if (text.replace(/^\uFEFF/, "").trim() === "") fail("the file is empty");

  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      bom: true,
      skip_empty_lines: true,
      // Spreadsheets often save trailing rows of bare commas.
      skip_records_with_empty_values: true,
      trim: true,
      relax_column_count: true,
      comment: "#",
      comment_no_infix: true,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (err) {
    const lines = (err as { lines?: number }).lines;
    const reason = (err as Error).message.replace(/\s+/g, " ").slice(0, 200);
    return fail(`could not read the CSV${lines ? ` near line ${lines}` : ""}: ${reason}`, lines);
  }
  const [head, ...body] = records;
  if (!head) return fail("the file is empty");
  const header = head.record.map((h) => h.trim().toLowerCase());
  const load = findColumn(header, "load", LOAD_UNITS);
  const deflection = findColumn(header, "deflection", DEFLECTION_UNITS);
  if (body.length > READINGS_LIMITS.maxRows)
    fail(`too many readings: more than ${READINGS_LIMITS.maxRows} rows (the limit is ${READINGS_LIMITS.maxRows})`);

  const raw: RawReading[] = [];
  const lines: number[] = [];
  for (const { record, info } of body) {
    const line = info.lines;
    if (record.length !== header.length)
      fail(`line ${line} has ${record.length} cell${record.length === 1 ? "" : "s"} but the header has ${header.length}`, line);
    raw.push({
      load: numberCell(record[load.index], line, load.name),
      deflection: numberCell(record[deflection.index], line, deflection.name),
    });
    lines.push(line);
  }
  const units = { load: load.unit, deflection: deflection.unit };
  return { units, raw, readings: readingsToSi(raw, units, lines), lines };
}
