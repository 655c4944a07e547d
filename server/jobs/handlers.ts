import type pino from "pino";
import type { JobName, JobTypes } from "./types";

export interface JobContext {
  jobId: string;
  log: pino.Logger;
  retryCount: number;
}
export type JobHandler<N extends JobName> = (data: JobTypes[N], ctx: JobContext) => Promise<void>;

// Filled in by feature areas (clip ingest registers clip.extract and clip.sweep).
export const handlers: { [N in JobName]?: JobHandler<N> } = {};
