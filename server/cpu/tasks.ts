// The CPU-bound work a request can start, run in worker threads (pool.ts) so that the event loop
// keeps answering meanwhile. Each task takes and returns plain data (structured clone: a Buffer
// arrives as a Uint8Array, a class instance as a plain object).
import { isMechanicsInputError, storedShotResults, type ShotResults } from "../../shared/mechanics/index";
import { renderShotReport } from "../readout/pdf/document";
import type { ReportInput } from "../readout/pdf/report";

export type ComputeOutcome = { results: ShotResults } | { inputError: string };

export const tasks = {
  /** The one-shot report's PDF (decision 092); 15–110 ms of layout per report. */
  async shotReportPdf(input: ReportInput): Promise<Uint8Array> {
    const thumbs = Object.fromEntries(Object.entries(input.thumbs).map(([k, v]) => [k, Buffer.from(v as Uint8Array)]));
    return renderShotReport({ ...input, thumbs });
  },
  /** The mechanics engine on one shot document, Monte Carlo uncertainty included (17–70 ms): the
   * stored results, computed as the Digitise preview computes them. Input errors come back as data:
   * an error's class does not survive the thread boundary. */
  computeShot(doc: unknown): ComputeOutcome {
    try {
      return { results: storedShotResults(doc) };
    } catch (e) {
      if (isMechanicsInputError(e)) return { inputError: e.message };
      throw e;
    }
  },
};

export type Tasks = typeof tasks;
