import { toDisplay, type Quantity, type UnitSystem } from "@shared/units";
import { useMe } from "./session/me";

const DEFAULT_DIGITS: Record<Quantity, number> = { speed: 1, length: 1, force: 0, energy: 1, moment: 1 };

export interface FormatOptions {
  /** Digits after the point; defaults per quantity. */
  digits?: number;
  /** Leave the unit off (e.g. in a column whose header carries it). */
  bare?: boolean;
  /** Defaults to the browser's locale. */
  locale?: string;
}

const nf = (digits: number, locale?: string) =>
  new Intl.NumberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits });

/** Formats an SI value for the chosen system, e.g. formatQuantity("speed", 40, "metric") → "144.0 km/h". */
export function formatQuantity(q: Quantity, si: number | null | undefined, system: UnitSystem, opts: FormatOptions = {}): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  const { value, unit } = toDisplay(q, si, system);
  const text = nf(opts.digits ?? DEFAULT_DIGITS[q], opts.locale).format(value);
  return opts.bare ? text : `${text} ${unit}`;
}

/** A value with its uncertainty, e.g. "144.0 ± 2.5 km/h". Both arrive in SI. */
export function formatWithUncertainty(
  q: Quantity,
  si: number | null | undefined,
  siUncertainty: number | null | undefined,
  system: UnitSystem,
  opts: FormatOptions = {},
): string {
  if (siUncertainty === null || siUncertainty === undefined || !Number.isFinite(siUncertainty)) return formatQuantity(q, si, system, opts);
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  const digits = opts.digits ?? DEFAULT_DIGITS[q];
  const v = toDisplay(q, si, system);
  // Conversions here are linear, so the uncertainty scales by the same factor as the value.
  const u = Math.abs(toDisplay(q, siUncertainty, system).value);
  const f = nf(digits, opts.locale);
  const text = `${f.format(v.value)} ± ${f.format(u)}`;
  return opts.bare ? text : `${text} ${v.unit}`;
}

export const unitLabel = (q: Quantity, system: UnitSystem) => toDisplay(q, 0, system).unit;

/** The signed-in person's unit system (metric until /api/me has answered) and formatters bound to it. */
export function useUnits() {
  const { data } = useMe();
  const system: UnitSystem = data?.prefs.units ?? "metric";
  return {
    system,
    format: (q: Quantity, si: number | null | undefined, opts?: FormatOptions) => formatQuantity(q, si, system, opts),
    formatPm: (q: Quantity, si: number | null | undefined, u: number | null | undefined, opts?: FormatOptions) =>
      formatWithUncertainty(q, si, u, system, opts),
    unit: (q: Quantity) => unitLabel(q, system),
    toDisplay: (q: Quantity, si: number) => toDisplay(q, si, system),
  };
}
