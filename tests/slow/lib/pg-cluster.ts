// A throwaway PostgreSQL cluster on its own loopback port, for tests that restore into a fresh
// cluster or stop and start the server under load. Never the shared private cluster.
// initdb/pg_ctl refuse root, so as root they run as the postgres user, in a folder under /var/tmp
// that user can reach.
import { execFileSync } from "node:child_process";
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import path from "node:path";

function bindir(): string {
  const base = "/usr/lib/postgresql";
  for (const v of existsSync(base) ? readdirSync(base).sort().reverse() : []) {
    const d = path.join(base, v, "bin");
    if (existsSync(path.join(d, "initdb"))) return d;
  }
  throw new Error("PostgreSQL is not installed (no initdb under /usr/lib/postgresql)");
}

const isRoot = process.getuid?.() === 0;
function asPg(cmd: string, args: string[], timeoutMs = 30_000) {
  const [file, argv] = isRoot ? ["runuser", ["-u", "postgres", "--", cmd, ...args]] : [cmd, args];
  return execFileSync(file, argv, { encoding: "utf8", timeout: timeoutMs, stdio: ["ignore", "pipe", "pipe"] });
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

export interface Cluster {
  port: number;
  /** postgres://postgres@127.0.0.1:<port>/<db> (trust auth on loopback: the cluster is throwaway). */
  url(db?: string): string;
  createDatabase(name: string): void;
  start(): void;
  /** Fast shutdown: open connections are cut, as a crash or a restart by the host would. */
  stop(): void;
  destroy(): void;
}

export async function startCluster(label = "test"): Promise<Cluster> {
  const bin = bindir();
  const dir = mkdtempSync(path.join("/var/tmp", `loadframe-${label}-pg-`));
  if (isRoot) chownSync(dir, Number(execFileSync("id", ["-u", "postgres"], { encoding: "utf8" }).trim()), Number(execFileSync("id", ["-g", "postgres"], { encoding: "utf8" }).trim()));
  asPg(path.join(bin, "initdb"), ["-D", dir, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8", "--no-sync"]);
  const port = await freePort();
  const opts = `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories='' -c fsync=off -c max_connections=100`;
  const c: Cluster = {
    port,
    url: (db = "postgres") => `postgres://postgres@127.0.0.1:${port}/${db}`,
    createDatabase: (name) => void asPg(path.join(bin, "psql"), [c.url(), "-qAt", "-c", `create database "${name}"`]),
    start: () => void asPg(path.join(bin, "pg_ctl"), ["-D", dir, "-l", path.join(dir, "server.log"), "-w", "-t", "30", "-o", opts, "start"]),
    stop: () => void asPg(path.join(bin, "pg_ctl"), ["-D", dir, "-m", "fast", "-w", "-t", "30", "stop"]),
    destroy: () => {
      if (!existsSync(dir)) return;
      try {
        asPg(path.join(bin, "pg_ctl"), ["-D", dir, "-m", "immediate", "-w", "stop"]);
      } catch {
        // not running
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
  c.start();
  // A test process that dies without its afterAll (killed, or its output pipe closed) must not
  // leave a server running on the machine.
  process.once("exit", () => c.destroy());
  return c;
}
