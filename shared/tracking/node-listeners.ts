// Loading OpenCV's JavaScript build in Node installs process-wide handlers: one rethrows every
// uncaught exception, one aborts the WebAssembly runtime on any unhandled rejection anywhere in the
// process. This module is imported just before OpenCV (imports evaluate in order) so that
// opencv.ts can remove exactly the handlers OpenCV added. In a browser or worker it does nothing.

type ProcessLike = {
  listeners(event: string): ((...args: unknown[]) => void)[];
  removeListener(event: string, fn: (...args: unknown[]) => void): unknown;
};

const events = ["uncaughtException", "unhandledRejection"] as const;
const proc = (globalThis as { process?: Partial<ProcessLike> }).process;
const nodeProcess = typeof proc?.listeners === "function" && typeof proc.removeListener === "function" ? (proc as ProcessLike) : undefined;

const before = new Map(events.map((e) => [e, new Set(nodeProcess?.listeners(e) ?? [])]));

/** Removes the process handlers added since this module was evaluated; returns how many. */
export function removeHandlersAddedSinceSnapshot(): number {
  if (!nodeProcess) return 0;
  let removed = 0;
  for (const e of events) {
    for (const fn of nodeProcess.listeners(e)) {
      if (!before.get(e)!.has(fn)) {
        nodeProcess.removeListener(e, fn);
        removed++;
      }
    }
  }
  return removed;
}
