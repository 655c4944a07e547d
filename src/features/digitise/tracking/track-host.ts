// The worker's side of the protocol (protocol.ts), apart from the Worker global so it can be
// tested in Node: runs one track at a time, posts progress, proposals and exactly one done/error.
import { isTrackInputError } from "@shared/tracking/errors";
import { track } from "@shared/tracking/track";
import type { FrameMark, FrameSource } from "@shared/tracking/types";
import { frameRange, frameUrl, startMessage, type FramesSpec, type FromWorker, type StartMessage } from "./protocol";
import { urlFrameSource } from "./gray-frames";

export interface TrackHostDeps {
  post(message: FromWorker): void;
  /** Frames of the spec by index 0 … n−1 (default: fetched and decoded from their URLs). */
  source?(spec: FramesSpec, length: number): FrameSource;
}

const defaultSource = (spec: FramesSpec, length: number) => {
  const { first } = frameRange(spec);
  return urlFrameSource(length, (i) => frameUrl(spec, first + i));
};

export function createTrackHost(deps: TrackHostDeps) {
  const runs = new Map<number, AbortController>();
  const sourceFor = deps.source ?? defaultSource;

  async function run(msg: StartMessage, controller: AbortController) {
    const { runId, frames, options } = msg;
    const { first, last } = frameRange(frames);
    const toIndex = (field: string, m: FrameMark): FrameMark => {
      if (m.frame < first || m.frame > last) throw new RangeError(`${field}.frame ${m.frame} is outside the frames ${first} … ${last}`);
      return { frame: m.frame - first, x: m.x, y: m.y };
    };
    try {
      const result = await track(
        {
          ...options,
          frames: sourceFor(frames, last - first + 1),
          start: toIndex("start", msg.start),
          prior: msg.prior && toIndex("prior", msg.prior),
          signal: controller.signal,
        },
        ({ done, total, proposal: p }) => {
          deps.post({ type: "proposal", runId, frame: p.frame + first, x: p.x, y: p.y, confidence: p.confidence, sideLobe: p.sideLobe });
          deps.post({ type: "progress", runId, done, total });
        },
      );
      const s = result.stop;
      deps.post({
        type: "done",
        runId,
        reason: s.reason,
        frame: s.frame === null ? null : s.frame + first,
        confidence: s.confidence,
        message: s.message,
        proposals: result.proposals.length,
      });
    } catch (e) {
      const field = isTrackInputError(e) ? e.field : undefined;
      deps.post({ type: "error", runId, message: e instanceof Error ? e.message : String(e), ...(field ? { field } : {}) });
    } finally {
      if (runs.get(runId) === controller) runs.delete(runId);
    }
  }

  return {
    /** Handles one message from the page; returns the run's promise for a start (for tests). */
    handle(data: unknown): Promise<void> | undefined {
      const type = (data as { type?: unknown } | null)?.type;
      const runId = Number((data as { runId?: unknown } | null)?.runId);
      if (type === "cancel") {
        runs.get(runId)?.abort();
        return undefined;
      }
      const parsed = startMessage.safeParse(data);
      if (!parsed.success) {
        const issue = parsed.error.issues[0];
        const where = issue.path.join(".");
        deps.post({ type: "error", runId: Number.isInteger(runId) ? runId : -1, message: where ? `${where}: ${issue.message}` : issue.message, ...(where ? { field: where } : {}) });
        return undefined;
      }
      for (const c of runs.values()) c.abort(); // one run at a time: a new start replaces the old
      const controller = new AbortController();
      runs.set(parsed.data.runId, controller);
      return run(parsed.data, controller);
    },
  };
}
