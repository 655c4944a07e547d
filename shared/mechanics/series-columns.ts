import type { SegmentLabel, Series, SeriesPoint } from "../schemas/shot-results";

// A readout chart's samples as the results store them: columns, and numbers to the digits a chart
// or a reader can use (decision 202). What they round away is far below any result's ±: a value
// keeps 6 significant digits (1 part in 10⁶; a speed's u is a part in 10² or more), a time
// 1 ns (the finest camera timestamps are µs [M]).

const VALUE_DIGITS = 6;
const TIME_STEPS_PER_MS = 1e6;

/** `v` to `digits` significant digits, as the double nearest that decimal (so JSON prints it short). */
export function toSignificant(v: number, digits = VALUE_DIGITS): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  const places = digits - 1 - Math.floor(Math.log10(Math.abs(v)));
  // An integer divided (or multiplied) by an exact power of ten is correctly rounded: the nearest double.
  if (places > 0 && places <= 22) return Math.round(v * 10 ** places) / 10 ** places;
  if (places <= 0 && places >= -22) return Math.round(v / 10 ** -places) * 10 ** -places;
  return v;
}

/** A time in ms to the nearest ns. */
export const toNanosecond = (ms: number) => Math.round(ms * TIME_STEPS_PER_MS) / TIME_STEPS_PER_MS;

/** Builds one series sample by sample, in frame order. */
export class SeriesColumns {
  private readonly frame: number[] = [];
  private readonly tFromStrikeMs: number[] = [];
  private readonly value: number[] = [];
  private readonly segments: [SegmentLabel, number][] = [];

  constructor(private readonly unit: string) {}

  push(frame: number, tFromStrikeMs: number, value: number, segment: SegmentLabel): void {
    this.frame.push(frame);
    this.tFromStrikeMs.push(toNanosecond(tFromStrikeMs));
    this.value.push(toSignificant(value));
    const run = this.segments[this.segments.length - 1];
    if (run?.[0] === segment) run[1]++;
    else this.segments.push([segment, 1]);
  }

  done(): Series {
    return { unit: this.unit, frame: this.frame, tFromStrikeMs: this.tFromStrikeMs, value: this.value, segments: this.segments };
  }
}

/** The samples of a series as objects, for readers that walk them one by one (tests, the PDF). */
export function seriesPoints(s: Series): SeriesPoint[] {
  const out: SeriesPoint[] = [];
  let i = 0;
  for (const [segment, n] of s.segments)
    for (let k = 0; k < n; k++, i++) out.push({ frame: s.frame[i], tFromStrikeMs: s.tFromStrikeMs[i], value: s.value[i], segment });
  return out;
}
