import type { SegmentLabel, SeriesPoint } from "../schemas/shot-results";

/**
 * One sample of a readout chart, as stored: a plain SeriesPoint to JSON, the database and every
 * reader (the same own fields in the same order). A class rather than an object literal because a
 * shot has tens of thousands of them and V8 builds these instances much faster inside a
 * computation: measured on the 10,000-marks-per-track benchmark shot, 4–7 ms less CPU per
 * computation (docs/decisions/142-engine-cpu-series-and-passes.md).
 */
export class ChartPoint implements SeriesPoint {
  frame: number;
  tMs: number;
  tFromStrikeMs: number;
  value: number;
  segment: SegmentLabel;

  constructor(frame: number, tMs: number, tFromStrikeMs: number, value: number, segment: SegmentLabel) {
    this.frame = frame;
    this.tMs = tMs;
    this.tFromStrikeMs = tFromStrikeMs;
    this.value = value;
    this.segment = segment;
  }
}
