// Parser for ffmpeg's `-progress` output: blocks of key=value lines, each block closed by a
// `progress=continue` or `progress=end` line. Chunks from the pipe may split lines anywhere.

export interface FfmpegProgress {
  /** Frames handed to the first video output so far. */
  frame: number;
  /** Output position in microseconds, when ffmpeg knows it. */
  outTimeUs?: number;
  /** Bytes written so far ("N/A" for image sequences is left undefined). */
  totalSize?: number;
  /** True on the last block of a run that ended normally. */
  end: boolean;
}

const num = (v: string | undefined): number | undefined => {
  if (v === undefined) return undefined;
  const n = Number(v);
  return Number.isFinite(n) ? n : undefined;
};

export class ProgressParser {
  private partial = "";
  private fields: Record<string, string> = {};

  /** Feed a chunk; returns the blocks it completed, oldest first. */
  push(chunk: string): FfmpegProgress[] {
    const text = this.partial + chunk;
    const lines = text.split(/\r?\n/);
    this.partial = lines.pop() ?? "";
    const done: FfmpegProgress[] = [];
    for (const line of lines) {
      const eq = line.indexOf("=");
      if (eq <= 0) continue;
      const key = line.slice(0, eq).trim();
      const value = line.slice(eq + 1).trim();
      if (key === "progress") {
        done.push({
          frame: num(this.fields.frame) ?? 0,
          outTimeUs: num(this.fields.out_time_us),
          totalSize: num(this.fields.total_size),
          end: value === "end",
        });
        this.fields = {};
      } else {
        this.fields[key] = value;
      }
    }
    return done;
  }
}

/** Percent done, 0–100, never above 99 until the run has ended (the frame total is an estimate). */
export function percentOf(frames: number, total: number | undefined, ended: boolean): number {
  if (ended) return 100;
  if (!total || total <= 0) return 0;
  return Math.min(99, Math.max(0, Math.floor((frames / total) * 100)));
}
