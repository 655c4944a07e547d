import { describe, expect, it } from "vitest";
import { startRunCost } from "../../../server/tracking/run-cost";

// What a tracking run cost its worker, as logged with the run's end and printed by bench:track
// (decision 156): CPU and event-loop use per phase, CPU per thread group, collections, page faults.

/** Spins until this process has spent `ms` of CPU (not wall time: on a loaded machine 120 ms of
 * wall time may hold only a few ms of CPU, and the busy phase must be told from the idle one). */
const burn = (ms: number) => {
  let x = 0;
  const cpu = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
  for (const end = cpu() + ms; cpu() < end; ) for (let i = 0; i < 1e4; i++) x += Math.sqrt(x + 1);
  return x;
};

describe("startRunCost", () => {
  it("tells a busy phase from an idle one, counts the JavaScript thread's CPU and the collections", async () => {
    const cost = startRunCost();
    burn(120);
    cost.phase("busy");
    await new Promise((r) => setTimeout(r, 120));
    cost.phase("idle");
    let keep = 0;
    for (let i = 0; i < 200; i++) keep += new Uint8Array(1 << 20)[i]; // 200 MB of short-lived buffers: young collections
    await new Promise((r) => setTimeout(r, 50)); // collections are reported to observers after the fact
    cost.phase("garbage");
    const c = cost.end();
    expect(keep).toBe(0);
    expect(c.phases.map((p) => p.phase)).toEqual(["busy", "idle", "garbage"]);
    const [busy, idle] = c.phases;
    expect(busy.user + busy.system).toBeGreaterThan(0.05);
    expect(idle.user + idle.system).toBeLessThan((busy.user + busy.system) / 2);
    expect(busy.busy).toBeGreaterThan(0.8);
    expect(idle.busy).toBeLessThan(0.5);
    expect(c.threads?.main).toBeGreaterThan(0.05);
    expect(c.gc.minor?.count ?? 0).toBeGreaterThan(0);
    expect(c.minorFaults).toBeGreaterThanOrEqual(0);
    expect(c.peakMb).toBeGreaterThan(0);
  });
});
