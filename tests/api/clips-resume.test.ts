// Resumable uploads: a paused upload continues where it stopped, and so does one whose
// connection was cut mid-chunk; the stored original's SHA-256 matches the file.
import { clipMeta, cookieOf, createUpload, makeClip, tusLeftovers, tusUpload } from "./clips-support";
import { createHash } from "node:crypto";
import http from "node:http";
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(() => srv.close());

const md = (title: string) => ({
  teamId: world.teamId, filename: `${title}.mp4`, meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player], title })),
});
const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");
// Noise makes the H.264 stream large enough for several chunks.
const bigClip = (name: string, seed: number) => readFileSync(makeClip(name, { frames: 40, size: "640x360", vf: `noise=alls=60:allf=t+u:all_seed=${seed}` }));

async function offsetOf(url: string) {
  const r = await fetch(url, { method: "HEAD", headers: { "tus-resumable": "1.0.0", cookie: cookieOf(coach) } });
  expect(r.status).toBe(200);
  return Number(r.headers.get("upload-offset"));
}

describe("resumable uploads", () => {
  it("pause, then resume from the server's offset; checksum matches", async () => {
    const data = bigClip("pause.mp4", 1);
    expect(data.length).toBeGreaterThan(1_000_000);
    const chunkSize = 128 * 1024;
    let url = "";
    await new Promise<void>((resolve) => {
      void tusUpload(srv.url, coach, data, md("Paused upload"), {
        chunkSize,
        onUpload: (u) => {
          const opts = u.options;
          opts.onChunkComplete = (_c, sent) => {
            if (sent >= data.length / 3 && !url) {
              url = u.url!;
              void u.abort().then(() => resolve()); // pause: keeps the upload on the server
            }
          };
        },
      });
    });
    const offset = await offsetOf(url);
    expect(offset).toBeGreaterThan(0);
    expect(offset).toBeLessThan(data.length);

    let firstReported = -1;
    const r = await tusUpload(srv.url, coach, data, md("Paused upload"), {
      uploadUrl: url,
      chunkSize,
      onProgress: (sent) => {
        if (firstReported < 0) firstReported = sent;
      },
    });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    expect(firstReported).toBeGreaterThanOrEqual(offset); // continued, did not start over
    const clip = (await coach.get(`/api/teams/${world.teamId}/clips/${r.body.clip.id}`)).json;
    expect(clip.sha256).toBe(sha(data));
    expect(clip.sizeBytes).toBe(data.length);
    expect(tusLeftovers()).toEqual([]);
  });

  it("a connection cut mid-chunk keeps what arrived; the upload resumes to a matching checksum", async () => {
    const data = bigClip("cut-conn.mp4", 2);
    const url = srv.url + (await createUpload(srv.url, coach, data.length, md("Dropped connection")));

    // Send half the file in one PATCH, then drop the socket before the rest.
    const half = Math.floor(data.length / 2);
    await new Promise<void>((resolve) => {
      const req = http.request(url, {
        method: "PATCH",
        headers: {
          "tus-resumable": "1.0.0", "upload-offset": "0", "content-type": "application/offset+octet-stream",
          "content-length": String(data.length), cookie: cookieOf(coach), origin: "http://127.0.0.1:3000",
        },
      });
      req.on("error", () => resolve());
      req.write(data.subarray(0, half), () => setTimeout(() => req.destroy(), 200));
    });
    let offset = 0;
    for (let i = 0; i < 50 && offset === 0; i++) {
      await new Promise((r) => setTimeout(r, 100)); // the server notices the cut and releases its lock
      offset = await offsetOf(url);
    }
    expect(offset).toBeGreaterThan(0);
    expect(offset).toBeLessThanOrEqual(half);

    const r = await tusUpload(srv.url, coach, data, md("Dropped connection"), { uploadUrl: url });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    const clip = (await coach.get(`/api/teams/${world.teamId}/clips/${r.body.clip.id}`)).json;
    expect(clip.sha256).toBe(sha(data));
    expect(tusLeftovers()).toEqual([]);
  });
});
