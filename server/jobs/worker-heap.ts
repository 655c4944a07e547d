// V8's heap settings for a worker process (decision 156). A tracking job streams about a gigabyte
// of short-lived grey frames and pipe chunks through ArrayBuffers, which V8 counts as external
// memory against the old generation's headroom. V8 sizes that headroom from the live heap by a
// factor it lowers when the process looks idle (the memory reducer, between jobs) or allocates
// little on its own heap: at about 1.4 × the ~60 MB live heap, every 20-odd MB of frames not yet
// collected started a full mark-compact, 40–60 of them per shot, each marked on every core — the
// worker's CPU for the same shot swung between 1.9 and 6 s. A fixed growing factor and no memory
// reducer keep the headroom wide; the heap may grow to 4 × its live size before a full collection.
import v8 from "node:v8";

export const WORKER_HEAP_FLAGS = ["--heap-growing-percent=300", "--no-memory-reducer"];

/** Before the first job: V8 reads these when it next sizes the old generation. */
export function tuneWorkerHeap() {
  for (const flag of WORKER_HEAP_FLAGS) v8.setFlagsFromString(flag);
}
