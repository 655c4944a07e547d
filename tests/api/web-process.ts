// A real web process (`node --import tsx server/index.ts`) on its own loopback port, with this test
// file's database, secret and upload folder: for tests where two processes serve one client.
import { spawn, type ChildProcess } from "node:child_process";
import { freePort } from "../slow/lib/pg-cluster";

export interface WebProcess {
  url: string;
  proc: ChildProcess;
  stop(): Promise<void>;
}

export async function startWebProcess(name: string, extraEnv: Record<string, string> = {}): Promise<WebProcess> {
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const proc = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
    // The test clients send Origin http://127.0.0.1:3000, as the in-process test server expects.
    env: { ...process.env, PORT: String(port), PUBLIC_URL: "http://127.0.0.1:3000", LF_PROCESS: name, ...extraEnv },
    stdio: ["ignore", "pipe", "inherit"],
  });
  // The last lines of its log (stdout), so a process that stops while starting says why.
  let tail: string[] = [];
  proc.stdout!.setEncoding("utf8").on("data", (chunk: string) => {
    tail = [...tail, ...chunk.split("\n").filter(Boolean)].slice(-15);
  });
  const exited = new Promise<void>((r) => proc.once("exit", () => r()));
  const t0 = Date.now();
  while (!(await fetch(`${url}/api/health`).then((r) => r.ok, () => false))) {
    if (proc.exitCode !== null) throw new Error(`${name} exited with ${proc.exitCode} while starting:\n${tail.join("\n")}`);
    if (Date.now() - t0 > 90_000) throw new Error(`${name} did not answer /api/health within 90 s`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    url,
    proc,
    stop: async () => {
      if (proc.exitCode === null) proc.kill("SIGTERM");
      await exited;
    },
  };
}
