// The storage folder runs full or turns read-only (a small tmpfs, filled or remounted read-only;
// needs root to mount, skipped otherwise): uploads get a bounded problem+json answer, no clip row
// or stored object points at a half file, readiness names the storage, and once space is back an
// interrupted upload resumes to a clip whose checksum matches.
import { clipMeta, cookieOf, makeClip } from "../api/clips-support";
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "../api/helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { db } from "../../server/db/client";
import { clip } from "../../server/db/schema";
import { env } from "../../server/env";

const mnt = mkdtempSync(path.join(os.tmpdir(), "lf-disk-"));
const sh = (cmd: string, ...args: string[]) => execFileSync(cmd, args, { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
const canMount = (() => {
  try {
    sh("mount", "-t", "tmpfs", "-o", "size=600m", "tmpfs", mnt);
    return true;
  } catch {
    return false;
  }
})();
process.env.UPLOAD_DIR = mnt; // after clips-support set its own: env() is first read in startServer

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
const file = makeClip("disk.mp4", { frames: 200, size: "640x360" });
const data = readFileSync(file);
const b64 = (s: string) => Buffer.from(s).toString("base64");

beforeAll(async () => {
  if (!canMount) return;
  srv = await startServer();
  expect(env().UPLOAD_DIR).toBe(mnt);
  world = await seedWorld();
  await startJobs({ work: false });
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  if (!canMount) return;
  await stopJobs();
  await srv.close();
  sh("umount", mnt);
  rmSync(mnt, { recursive: true, force: true });
});

const headers = () => ({ cookie: cookieOf(coach), origin: "http://127.0.0.1:3000", "tus-resumable": "1.0.0" });
const create = () =>
  fetch(`${srv.url}/api/uploads`, {
    method: "POST",
    headers: {
      ...headers(), "upload-length": String(data.length),
      "upload-metadata": `teamId ${b64(world.teamId)},filename ${b64("disk.mp4")},meta ${b64(JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] })))}`,
    },
    signal: AbortSignal.timeout(30_000),
  });
const patch = (url: string, offset: number) =>
  fetch(url, { method: "PATCH", headers: { ...headers(), "upload-offset": String(offset), "content-type": "application/offset+octet-stream" }, body: data.subarray(offset), signal: AbortSignal.timeout(30_000) });
/** Fill the disk until `leaveKiB` are free. */
const fill = (leaveKiB: number) => {
  const free = Number(sh("df", "-k", "--output=avail", mnt).trim().split("\n").pop());
  sh("dd", "if=/dev/zero", `of=${path.join(mnt, "filler")}`, "bs=1k", `count=${Math.max(0, free - leaveKiB)}`);
};
const unfill = () => rmSync(path.join(mnt, "filler"), { force: true });
const clipRows = async () => db().select({ id: clip.id, sha256: clip.sha256 }).from(clip).where(eq(clip.teamId, world.teamId));
const storedObjects = () => (existsSync(path.join(mnt, "clips")) ? readdirSync(path.join(mnt, "clips"), { recursive: true }) : []);
async function expectProblem(r: Response, status: RegExp) {
  expect(String(r.status)).toMatch(status);
  const body = JSON.parse(await r.text());
  expect(body).toMatchObject({ type: "about:blank", status: r.status });
  expect(body.detail).toEqual(expect.any(String));
  return body;
}
const ready = async () => (await fetch(`${srv.url}/api/ready`)).json();

describe.skipIf(!canMount)("the storage folder full or read-only", () => {
  it("refuses a new upload up front when the disk is short of space, storing nothing", async () => {
    fill(50 * 1024);
    try {
      const body = await expectProblem(await create(), /^507$/);
      expect(body.code).toBe("disk_full");
      expect(body.detail).toMatch(/short of disk space/);
      expect(readdirSync(path.join(mnt, ".tus"))).toEqual([]);
    } finally {
      unfill();
    }
    expect(await clipRows()).toEqual([]);
  });

  it("a disk that fills mid-upload: an error answer, no clip, and the upload resumes once space is back", async () => {
    const c = await create();
    expect(c.status).toBe(201);
    const url = new URL(c.headers.get("location")!, srv.url).toString();
    fill(100);
    try {
      const body = await expectProblem(await patch(url, 0), /^5\d\d$/);
      console.info(`disk full mid-upload answered: ${body.status} ${body.code}: ${body.detail}`);
      // RFC 4918 §11.5: 507 Insufficient Storage names the cause the person can act on.
      expect([body.status, body.code]).toEqual([507, "disk_full"]);
      expect(await clipRows()).toEqual([]);
      expect(storedObjects()).toEqual([]);
    } finally {
      unfill();
    }
    const head = await fetch(url, { method: "HEAD", headers: headers() });
    const offset = Number(head.headers.get("upload-offset"));
    expect(offset).toBeLessThan(data.length);
    const done = await patch(url, offset);
    expect(done.status).toBe(200);
    const made = JSON.parse(await done.text()).clip;
    const sha = createHash("sha256").update(data).digest("hex");
    expect(await clipRows()).toEqual([{ id: made.id, sha256: sha }]);
    expect(createHash("sha256").update(readFileSync(path.join(mnt, "clips", made.id, "original"))).digest("hex")).toBe(sha);
  });

  it("a read-only storage folder: uploads answer an error, readiness names the storage, nothing is stored", async () => {
    const before = await clipRows();
    sh("mount", "-o", "remount,ro", mnt);
    try {
      const r = await ready();
      expect(r.ok).toBe(false);
      expect(r.checks.storage).toEqual({ ok: false, detail: expect.stringMatching(/cannot write to the storage|not writable/) });
      expect(r.checks.database.ok).toBe(true);
      const body = await expectProblem(await create(), /^5\d\d$/);
      console.info(`read-only storage answered: ${body.status} ${body.code}: ${body.detail}`);
      expect([body.status, body.code]).toEqual([503, "storage_unwritable"]);
    } finally {
      sh("mount", "-o", "remount,rw", mnt);
    }
    expect(await clipRows()).toEqual(before);
    expect((await ready()).checks.storage.ok).toBe(true);
  });
});
