// What one tracking run cost the worker process, logged with the run's end and printed by
// bench:track (decision 156): CPU and event-loop use by phase, CPU on the JavaScript thread against
// the others (V8's helpers, which mark the heap concurrently and compile), user against system
// time, garbage-collection pauses by kind, page faults and peak memory. Linux's /proc gives the
// per-thread and fault figures; elsewhere those are left out.
import { readdirSync, readFileSync } from "node:fs";
import { PerformanceObserver, performance, type EventLoopUtilization } from "node:perf_hooks";

/** CPU seconds (utime + stime, in clock ticks of 1/100 s on Linux) of each thread of a process, by thread id. */
function threadTimes(): Map<string, { cpu: number }> | null {
  try {
    const out = new Map<string, { cpu: number }>();
    for (const tid of readdirSync("/proc/self/task")) {
      const s = readFileSync(`/proc/self/task/${tid}/stat`, "utf8");
      const f = s.slice(s.lastIndexOf(")") + 2).split(" ");
      out.set(tid, { cpu: (Number(f[11]) + Number(f[12])) / 100 });
    }
    return out;
  } catch {
    return null;
  }
}

/** Minor and major page faults of the whole process so far, and its peak and current resident memory (MB). */
function memoryFigures() {
  try {
    const f = readFileSync("/proc/self/stat", "utf8").split(") ")[1].split(" ");
    const status = readFileSync("/proc/self/status", "utf8");
    const kb = (key: string) => Number(new RegExp(`^${key}:\\s+(\\d+)`, "m").exec(status)?.[1] ?? NaN);
    return { minorFaults: Number(f[7]), majorFaults: Number(f[9]), peakMb: kb("VmHWM") / 1024, rssMb: kb("VmRSS") / 1024 };
  } catch {
    return null;
  }
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;

export interface RunCost {
  /** CPU seconds (user and system) and share of the event loop busy, per phase in order. */
  phases: { phase: string; user: number; system: number; busy: number }[];
  /**
   * CPU seconds of the whole run on the JavaScript thread and on all others (V8's helpers marking
   * the heap concurrently and compiling, libuv's pool); Node names them all "node".
   */
  threads: { main: number; other: number } | null;
  /** Garbage collection: main-thread pause seconds and count, per kind. */
  gc: Record<string, { seconds: number; count: number }>;
  minorFaults: number | null;
  majorFaults: number | null;
  peakMb: number | null;
  /** Growth of V8's count of memory held outside its heap (ArrayBuffers: the frames), MB. */
  externalMb: number;
}

const GC_KINDS: Record<number, string> = { 1: "minor", 2: "major", 4: "incremental", 8: "weak callbacks" };

export type RunCostMeter = ReturnType<typeof startRunCost>;

/** Starts counting now; `phase(name)` closes the phase running since the last call; `end()` gives the figures, `stop()` only stops listening. */
export function startRunCost() {
  const gc: RunCost["gc"] = {};
  const observer = new PerformanceObserver((list) => {
    for (const e of list.getEntries()) {
      const kind = GC_KINDS[(e as unknown as { detail?: { kind?: number } }).detail?.kind ?? 0] ?? "other";
      const g = (gc[kind] ??= { seconds: 0, count: 0 });
      g.seconds += e.duration / 1000;
      g.count++;
    }
  });
  observer.observe({ entryTypes: ["gc"] });
  const threads0 = threadTimes();
  const mem0 = memoryFigures();
  const external0 = process.memoryUsage().external;
  const phases: RunCost["phases"] = [];
  let cpu = process.cpuUsage();
  let elu: EventLoopUtilization = performance.eventLoopUtilization();
  return {
    phase(name: string) {
      const c = process.cpuUsage(cpu);
      const e = performance.eventLoopUtilization(elu);
      phases.push({ phase: name, user: round3(c.user / 1e6), system: round3(c.system / 1e6), busy: Math.round(e.utilization * 100) / 100 });
      cpu = process.cpuUsage();
      elu = performance.eventLoopUtilization();
    },
    stop() {
      observer.disconnect();
    },
    end(): RunCost {
      observer.disconnect();
      const threads1 = threadTimes();
      const mem1 = memoryFigures();
      let threads: RunCost["threads"] = null;
      if (threads0 && threads1) {
        threads = { main: 0, other: 0 };
        for (const [tid, t] of threads1) threads[tid === String(process.pid) ? "main" : "other"] += t.cpu - (threads0.get(tid)?.cpu ?? 0);
        threads = { main: round3(threads.main), other: round3(threads.other) };
      }
      for (const g of Object.values(gc)) g.seconds = round3(g.seconds);
      return {
        phases,
        threads,
        gc,
        minorFaults: mem0 && mem1 ? mem1.minorFaults - mem0.minorFaults : null,
        majorFaults: mem0 && mem1 ? mem1.majorFaults - mem0.majorFaults : null,
        peakMb: mem1 ? Math.round(mem1.peakMb) : null,
        externalMb: Math.round((process.memoryUsage().external - external0) / 1048576),
      };
    },
  };
}
