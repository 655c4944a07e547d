// V8's heap settings for the processes that stream buffers: a worker (decision 156) and a web
// process (decision 193). Both push ArrayBuffers through that V8 counts as external memory
// against the old generation's headroom: a tracking job about a gigabyte of grey frames and pipe
// chunks, a web process ~300 kB for each first read of a shot's readout (pg's reads of its ~85 kB
// row, the answer's bytes). V8 sizes that headroom from the live heap by a factor it lowers when
// the process looks idle (the memory reducer) or allocates little on its own heap: at about 1.4 ×
// the ~50–60 MB live heap, every 20-odd MB of buffers not yet collected started a full
// mark-compact, marked on every core — 40–60 a shot in the worker, one every ~30 first reads in a
// web process, doubling their CPU. A fixed growing factor and no memory reducer keep the headroom
// wide; the heap may grow to 4 × its live size before a full collection.
import v8 from "node:v8";

export const HEAP_FLAGS = ["--heap-growing-percent=300", "--no-memory-reducer"];

/** At start-up: V8 reads these when it next sizes the old generation. */
export function tuneHeap() {
  for (const flag of HEAP_FLAGS) v8.setFlagsFromString(flag);
}
