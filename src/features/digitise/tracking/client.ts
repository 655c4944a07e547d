// The page's handle on the tracking worker: one worker, reused (OpenCV loads once, ~0.3 s), one
// run at a time. Starting a run cancels the one before it.
import type { DoneMessage, FromWorker, ProposalMessage, StartMessage } from "./protocol";

export type TrackRunRequest = Omit<StartMessage, "type" | "runId">;

export interface TrackRunHandlers {
  onProposal?(p: ProposalMessage): void;
  onProgress?(done: number, total: number): void;
}

export interface TrackRun {
  readonly runId: number;
  /** Resolves with the stop (reason "cancelled" after cancel()); rejects on a bad request or unreadable frame. */
  readonly finished: Promise<DoneMessage>;
  cancel(): void;
}

export class TrackRunError extends Error {
  constructor(
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = "TrackRunError";
  }
}

/** What the client needs of a Worker (a fake one in tests). */
export interface WorkerLike {
  postMessage(message: unknown): void;
  onmessage: ((e: MessageEvent) => void) | null;
  onerror: ((e: ErrorEvent) => void) | null;
  terminate(): void;
}

const spawn = (): WorkerLike => new Worker(new URL("./track.worker.ts", import.meta.url), { type: "module" });

interface Pending {
  handlers: TrackRunHandlers;
  resolve(d: DoneMessage): void;
  reject(e: Error): void;
}

export function createTrackingClient(createWorker: () => WorkerLike = spawn) {
  let worker: WorkerLike | null = null;
  let nextId = 1;
  const pending = new Map<number, Pending>();

  const failAll = (message: string) => {
    for (const p of pending.values()) p.reject(new TrackRunError(message));
    pending.clear();
    worker?.terminate();
    worker = null;
  };

  const ensureWorker = () => {
    if (worker) return worker;
    const w = createWorker();
    w.onmessage = (e: MessageEvent) => {
      const m = e.data as FromWorker;
      const p = pending.get(m.runId);
      if (!p) return;
      if (m.type === "proposal") p.handlers.onProposal?.(m);
      else if (m.type === "progress") p.handlers.onProgress?.(m.done, m.total);
      else {
        pending.delete(m.runId);
        if (m.type === "done") p.resolve(m);
        else p.reject(new TrackRunError(m.message, m.field));
      }
    };
    w.onerror = (e: ErrorEvent) => failAll(`the tracking worker failed: ${e.message || "could not start"}`);
    worker = w;
    return w;
  };

  return {
    start(request: TrackRunRequest, handlers: TrackRunHandlers = {}): TrackRun {
      const w = ensureWorker();
      for (const id of pending.keys()) w.postMessage({ type: "cancel", runId: id });
      const runId = nextId++;
      const finished = new Promise<DoneMessage>((resolve, reject) => pending.set(runId, { handlers, resolve, reject }));
      w.postMessage({ type: "start", runId, ...request } satisfies StartMessage);
      return { runId, finished, cancel: () => worker?.postMessage({ type: "cancel", runId }) };
    },
    /** Stops the worker; runs still going reject. */
    dispose() {
      failAll("the tracking client was closed");
    },
  };
}

export type TrackingClient = ReturnType<typeof createTrackingClient>;
