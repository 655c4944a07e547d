// WEB_PROCESSES=2: one supervisor and two web processes on one port (server/web-processes.ts). A web
// process that dies is replaced while the other keeps answering, a signed-in session is good on
// every process, and a stop signal ends them all. (One upload served by two processes:
// uploads-web-processes.test.ts.)
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld } from "./helpers";
import { startWebProcess, type WebProcess } from "./web-process";

let web: WebProcess;
let world: Awaited<ReturnType<typeof seedWorld>>;

const children = (pid: number) =>
  readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number);
async function until<T>(what: string, fn: () => T | undefined | false, timeoutMs = 60_000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = fn();
    if (v) return v;
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
/** Each request on a new connection, so the supervisor hands them out in turn. */
const fresh = (path: string, cookie = "") => fetch(web.url + path, { headers: { connection: "close", cookie } });

beforeAll(async () => {
  world = await seedWorld();
  web = await startWebProcess("web", { WEB_PROCESSES: "2" });
}, 180_000);
afterAll(() => web?.stop());

describe("WEB_PROCESSES=2", () => {
  it("two web processes serve one port; one that dies is replaced while the other answers; SIGTERM stops them all", async () => {
    const pid = web.proc.pid!;
    const [first, second] = await until("two web processes", () => children(pid).length === 2 && children(pid));

    const coach = await new Client(web.url).signIn(EMAILS.coach);
    const cookie = [...(coach as unknown as { cookies: Map<string, string> }).cookies].map(([k, v]) => `${k}=${v}`).join("; ");
    for (let i = 0; i < 10; i++) expect((await fresh(`/api/teams/${world.teamId}/clips`, cookie)).status).toBe(200);

    process.kill(first, "SIGKILL");
    // While the supervisor starts a replacement, the other process answers every request.
    const statuses: number[] = [];
    const replaced = until("a replacement process", () => {
      const now = children(pid);
      return now.length === 2 && !now.includes(first) && now;
    });
    let done = false;
    void replaced.finally(() => (done = true));
    await new Promise((r) => setTimeout(r, 300));
    while (!done) statuses.push((await fresh("/api/health")).status);
    expect(await replaced).toContain(second);
    expect(statuses.length).toBeGreaterThan(0);
    expect(statuses.every((s) => s === 200)).toBe(true);
    // The other one dies too: the port is served again by the new processes alone.
    process.kill(second, "SIGKILL");
    const next = await until("the other replacement", () => {
      const c = children(pid);
      return c.length === 2 && !c.includes(second) && !c.includes(first) && c;
    });
    let ok = false;
    for (let i = 0; i < 300 && !ok; i++) {
      ok = await fresh(`/api/teams/${world.teamId}/clips`, cookie).then((r) => r.status === 200, () => false);
      if (!ok) await new Promise((r) => setTimeout(r, 200));
    }
    expect(ok).toBe(true);

    const exitCode = new Promise<number | null>((r) => web.proc.once("exit", (code) => r(code)));
    web.proc.kill("SIGTERM");
    expect(await exitCode).toBe(0);
    for (const c of next) expect(() => process.kill(c, 0)).toThrow(); // none left running
  });
});
