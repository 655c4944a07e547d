// Several web processes serve one upload: the tus lock lives in PostgreSQL (server/clips/upload-lock.ts),
// so a request that reaches another process still asks the current holder to let go and waits for
// it, and the upload resumes there to a matching checksum. The locker itself is checked with two
// instances, i.e. two database sessions, as two processes would hold them.
import { clipMeta, createUpload, makeClip, tusHeaders, tusLeftovers, tusUpload } from "./clips-support";
import { createHash } from "node:crypto";
import http from "node:http";
import { readFileSync } from "node:fs";
import { ERRORS } from "@tus/utils";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld } from "./helpers";
import { startWebProcess, type WebProcess } from "./web-process";
import pg from "pg";
import { PgUploadLocker } from "../../server/clips/upload-lock";

let a: WebProcess;
let b: WebProcess;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;

beforeAll(async () => {
  world = await seedWorld();
  [a, b] = await Promise.all([startWebProcess("web-a"), startWebProcess("web-b")]);
  coach = await new Client(a.url).signIn(EMAILS.coach); // the session cookie is good on both
}, 180_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
});

const sha = (d: Buffer) => createHash("sha256").update(d).digest("hex");
const never = () => new AbortController().signal;

describe("one upload, two web processes", () => {
  it("a HEAD on the second process makes the first let go of its PATCH, then the upload finishes there", async () => {
    const data = readFileSync(makeClip("two-procs.mp4", { frames: 40, size: "640x360", vf: "noise=alls=60:allf=t+u:all_seed=7" }));
    const metadata = { teamId: world.teamId, filename: "two-procs.mp4", meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player], title: "Two processes" })) };
    const headers = tusHeaders(coach);
    const location = await createUpload(a.url, coach, data.length, metadata);

    // Process A: a PATCH that sends a third of the file and then stalls, holding the upload's lock.
    const third = Math.floor(data.length / 3);
    let aEndedAt = 0;
    const patch = http.request(a.url + location, {
      method: "PATCH",
      headers: { ...headers, "upload-offset": "0", "content-type": "application/offset+octet-stream", "content-length": String(data.length) },
    });
    const aEnded = new Promise<void>((resolve) => {
      const done = () => {
        aEndedAt ||= Date.now();
        resolve();
      };
      patch.on("response", (res) => {
        res.resume();
        done();
      });
      patch.on("error", done);
      patch.on("close", done);
    });
    await new Promise<void>((r) => patch.write(data.subarray(0, third), () => r()));
    await new Promise((r) => setTimeout(r, 500));
    expect(aEndedAt).toBe(0); // still holding the lock

    // Process B: asks where the upload stands. It must wait until A's request has let go.
    const head = await fetch(b.url + location, { method: "HEAD", headers });
    const headAt = Date.now();
    expect(head.status).toBe(200);
    await Promise.race([aEnded, new Promise((r) => setTimeout(r, 1000))]);
    expect(aEndedAt, "A's PATCH was still running when B answered").toBeGreaterThan(0);
    expect(aEndedAt).toBeLessThanOrEqual(headAt);
    patch.destroy();
    const offset = Number(head.headers.get("upload-offset"));
    expect(offset).toBeGreaterThan(0);
    expect(offset).toBeLessThanOrEqual(third);

    // The rest goes to B; the stored clip is the file that was sent.
    const r = await tusUpload(b.url, coach, data, metadata, { uploadUrl: b.url + location, chunkSize: 256 * 1024 });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    const clip = (await coach.get(`/api/teams/${world.teamId}/clips/${r.body.clip.id}`)).json;
    expect(clip.sha256).toBe(sha(data));
    expect(clip.sizeBytes).toBe(data.length);
    expect(tusLeftovers()).toEqual([]);
  });

  it("an upload whose chunks alternate between the processes arrives whole", async () => {
    const data = readFileSync(makeClip("alternating.mp4", { frames: 40, size: "640x360", vf: "noise=alls=60:allf=t+u:all_seed=8" }));
    const metadata = { teamId: world.teamId, filename: "alternating.mp4", meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player], title: "Alternating" })) };
    const headers = tusHeaders(coach);
    const location = await createUpload(b.url, coach, data.length, metadata);
    // Each chunk goes to A or B in turn, as a round-robin balancer would send them.
    const chunk = 128 * 1024;
    let last: Response | undefined;
    for (let offset = 0, i = 0; offset < data.length; offset += chunk, i++) {
      last = await fetch((i % 2 ? b : a).url + location, {
        method: "PATCH",
        headers: { ...headers, "upload-offset": String(offset), "content-type": "application/offset+octet-stream" },
        body: data.subarray(offset, offset + chunk),
      });
      if (offset + chunk < data.length) {
        expect(last.status).toBe(204);
        expect(Number(last.headers.get("upload-offset"))).toBe(Math.min(offset + chunk, data.length));
      }
    }
    expect(last!.status).toBe(200);
    const { clip } = await last!.json();
    expect((await coach.get(`/api/teams/${world.teamId}/clips/${clip.id}`)).json.sha256).toBe(sha(data));
  });
});

describe("the PostgreSQL upload locker", () => {
  const url = () => process.env.DATABASE_URL!;

  it("many uploads at once: the lock connection runs one query at a time (node-postgres's own queue is deprecated)", async () => {
    // Counts each client's queries in flight, on the method every client inherits.
    const send = pg.Client.prototype.query as (...args: unknown[]) => unknown;
    const inFlight = new Map<pg.Client, number>();
    let most = 0;
    pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
      inFlight.set(this, (inFlight.get(this) ?? 0) + 1);
      most = Math.max(most, inFlight.get(this)!);
      const done = () => void inFlight.set(this, inFlight.get(this)! - 1);
      const r = send.apply(this, args);
      if (r instanceof Promise) void r.then(done, done);
      else done();
      return r;
    } as typeof pg.Client.prototype.query;
    const one = new PgUploadLocker(url(), 5_000);
    try {
      const locks = Array.from({ length: 12 }, (_, i) => one.newLock(`upload-many-${i}`));
      await Promise.all(locks.map((l) => l.lock(never(), () => {})));
      await Promise.all(locks.map((l) => l.unlock()));
    } finally {
      pg.Client.prototype.query = send as typeof pg.Client.prototype.query;
      await one.close();
    }
    expect(most).toBe(1);
  });

  it("two sessions exclude each other; the holder is asked to let go; the waiter gets the lock once it does", async () => {
    const one = new PgUploadLocker(url(), 5_000);
    const two = new PgUploadLocker(url(), 5_000);
    try {
      const held = one.newLock("upload-x");
      let asked = 0;
      await held.lock(never(), () => {
        asked++;
        setTimeout(() => void held.unlock(), 300); // lets go a moment later, as tus does
      });
      const t0 = Date.now();
      const waiter = two.newLock("upload-x");
      await waiter.lock(never(), () => {});
      expect(asked).toBe(1);
      expect(Date.now() - t0).toBeGreaterThanOrEqual(250);
      // Another upload is not held up by this one.
      const other = one.newLock("upload-y");
      await other.lock(never(), () => {});
      await other.unlock();
      await waiter.unlock();
    } finally {
      await Promise.all([one.close(), two.close()]);
    }
  });

  it("a holder that does not let go makes the waiter time out; a session that ends frees its locks", async () => {
    const one = new PgUploadLocker(url(), 600);
    const two = new PgUploadLocker(url(), 600);
    try {
      await one.newLock("upload-z").lock(never(), () => {});
      await expect(two.newLock("upload-z").lock(never(), () => {})).rejects.toBe(ERRORS.ERR_LOCK_TIMEOUT);
      await one.close(); // as when a web process dies
      const again = two.newLock("upload-z");
      await again.lock(never(), () => {});
      await again.unlock();
    } finally {
      await Promise.all([one.close(), two.close()]);
    }
  });

  it("inside one process, a second request waits for the first one's release", async () => {
    const one = new PgUploadLocker(url(), 5_000);
    try {
      const first = one.newLock("upload-w");
      let asked = 0;
      await first.lock(never(), () => {
        asked++;
        setTimeout(() => void first.unlock(), 200);
      });
      const second = one.newLock("upload-w");
      await second.lock(never(), () => {});
      expect(asked).toBe(1);
      await second.unlock();
    } finally {
      await one.close();
    }
  });
});
