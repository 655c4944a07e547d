// README flow: `scripts/start` in one window, `scripts/test` in another. The second finds the
// PostgreSQL cluster already running and must still exit 0 when everything passed. The scripts
// run for real in a throwaway copy of scripts/ (their own .data and cluster, on a free port),
// with npm, npx and node replaced by stubs that succeed at once: only the scripts' own exit
// handling is under test.
import { spawnSync } from "node:child_process";
import { chmodSync, cpSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

let root: string;
let env: NodeJS.ProcessEnv;
const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const p = (s.address() as { port: number }).port;
      s.close(() => resolve(p));
    });
  });
const sh = (script: string) => spawnSync("bash", ["-c", script], { cwd: root, env, encoding: "utf8", timeout: 120_000 });

beforeAll(async () => {
  root = mkdtempSync(path.join(os.tmpdir(), "lf-exit-"));
  chmodSync(root, 0o755);
  cpSync(path.resolve("scripts"), path.join(root, "scripts"), { recursive: true });
  // Newer than the lock file, so the scripts do not run npm ci.
  writeFileSync(path.join(root, "package-lock.json"), "{}");
  mkdirSync(path.join(root, "node_modules"));
  writeFileSync(path.join(root, "node_modules", ".package-lock.json"), "{}");
  const stubs = path.join(root, "stubs");
  mkdirSync(stubs);
  for (const tool of ["npm", "npx"]) {
    writeFileSync(path.join(stubs, tool), "#!/bin/sh\nexit 0\n");
    chmodSync(path.join(stubs, tool), 0o755);
  }
  // `node` succeeds at once, except as the payments fake, which scripts/test waits for on its port:
  // there the stub only holds that port open until the script's cleanup kills it.
  writeFileSync(path.join(stubs, "node"), [
    "#!/bin/sh",
    'case "$*" in *payments-fake*) exec python3 -c "import os,socket,time; s=socket.socket(); s.bind((\'127.0.0.1\', int(os.environ[\'PAYMENTS_API_PORT\']))); s.listen(); time.sleep(600)";; esac',
    "exit 0", "",
  ].join("\n"));
  chmodSync(path.join(stubs, "node"), 0o755);
  env = {
    ...process.env, PATH: `${stubs}:${process.env.PATH}`,
    PG_PORT: String(await freePort()), TEST_SMTP_PORT: String(await freePort()), TEST_INBOX_PORT: String(await freePort()),
    TEST_PAYMENTS_PORT: String(await freePort()),
  };
  // The cluster is already running when scripts/test starts (as with scripts/start in another window).
  const started = sh("source scripts/lib/common.sh && pg_start");
  expect(started.status, started.stderr).toBe(0);
}, 120_000);

afterAll(() => {
  if (!root) return;
  sh("source scripts/lib/common.sh && pg_stop; rm -rf \"$(pg_datadir)\"");
  rmSync(root, { recursive: true, force: true });
});

describe("the README's commands exit 0 on success in every order", { timeout: 120_000 }, () => {
  it("scripts/test with the cluster already running", () => {
    const r = sh("bash scripts/test");
    expect(r.status, r.stdout + r.stderr).toBe(0);
    // It left the cluster it did not start running.
    expect(sh("source scripts/lib/common.sh && as_pg \"$(pg_bindir)/pg_ctl\" -D \"$(pg_datadir)\" status").status).toBe(0);
  });

  it("a cluster started under the shared lock (flock LOCK scripts/test) does not keep holding it", () => {
    const lock = path.join(root, "heavy.lock");
    expect(sh("source scripts/lib/common.sh && pg_stop").status).toBe(0);
    const r = sh(`flock ${lock} bash -c 'source scripts/lib/common.sh && pg_start'`);
    expect(r.status, r.stderr).toBe(0);
    expect(sh("source scripts/lib/common.sh && as_pg \"$(pg_bindir)/pg_ctl\" -D \"$(pg_datadir)\" status").status).toBe(0);
    expect(sh(`flock -n ${lock} true`).status, "the lock is still held by the cluster").toBe(0);
  });
});
