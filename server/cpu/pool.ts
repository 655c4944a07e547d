// Worker threads for the CPU-heavy work a request can start (PDF reports, the mechanics engine):
// piscina's pool, so /api/health and every other request keep being answered while it runs
// (decision 172). Threads run at a lower priority than the event loop and are started on first use.
import os from "node:os";
import Piscina from "piscina";
import type { Tasks } from "./tasks";

let pool: Piscina | undefined;

/** Threads: one per core but one (the event loop's), at least one, at most four. */
export const cpuThreads = () => Math.min(4, Math.max(1, os.availableParallelism() - 1));

function thePool(): Piscina {
  pool ??= new Piscina({
    filename: new URL("./worker.mjs", import.meta.url).href,
    minThreads: 1,
    maxThreads: cpuThreads(),
    idleTimeout: 60_000,
    // On Linux, a nicer thread leaves the cores to request handling when both want them.
    niceIncrement: 5,
  });
  return pool;
}

/** Starts the threads now, so the first report does not wait for them to load (web processes). */
export function startCpuPool(): void {
  thePool();
}

/** Runs one task in a thread; tasks wait their turn when every thread is busy. */
export function offLoop<K extends keyof Tasks>(task: K, input: Parameters<Tasks[K]>[0]): Promise<Awaited<ReturnType<Tasks[K]>>> {
  return thePool().run({ task, input });
}

/** Ends the threads (at shutdown, and at the end of scripts). */
export async function closeCpuPool(): Promise<void> {
  const p = pool;
  pool = undefined;
  await p?.destroy();
}
