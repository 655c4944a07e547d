// extractClipFrames(): a stored clip's frames land in storage under their index keys, with the
// strip; an interrupted run followed by a retry ends with exactly one frame per index.
import { existsSync, readdirSync } from "node:fs";
import { readdir } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { FfmpegError } from "../../../server/media/errors";
import { JOB_DIR_PREFIX } from "../../../server/media/ffmpeg";
import { extractClipFrames, jobTmpRoot } from "../../../server/media/ingest";
import type { ExtractProgress } from "../../../server/media/extract";
import { probe, type ProbeResult } from "../../../server/media/probe";
import { clipKeys, LocalDiskStorage, type Storage } from "../../../server/storage";
import { startFakeS3 } from "../storage/fake-s3";
import { makeClip, tempDir, testMedia } from "./helpers";

let dir: string;
let cleanup: () => Promise<void>;
let clip: string;
let p: ProbeResult;
let s3: Awaited<ReturnType<typeof startFakeS3>>;
const media = () => testMedia({ tmpRoot: path.join(dir, "jobs") });

beforeAll(async () => {
  ({ dir, cleanup } = await tempDir("ingest"));
  clip = await makeClip(dir, "clip.mp4", { frames: 120, size: "320x180", rate: 240 });
  p = await probe(testMedia(), clip);
  s3 = await startFakeS3();
});
afterAll(async () => {
  await s3.stop();
  await cleanup();
});

const frameKeys = async (storage: Storage, clipId: string) =>
  (await storage.list(clipKeys.framesPrefix(clipId))).map((o) => o.key.split("/").pop());
const allFrameNames = (n: number) => Array.from({ length: n }, (_, i) => `${String(i + 1).padStart(6, "0")}.jpg`);

describe.each([
  { name: "local disk", make: () => new LocalDiskStorage({ root: path.join(dir, "uploads") }) as Storage },
  { name: "S3", make: () => s3.storage() as Storage },
])("extractClipFrames on $name", ({ make }) => {
  it("stores every frame by index and the strip, reporting gap-free progress", async () => {
    const storage = make();
    const clipId = `c-${Math.random().toString(36).slice(2, 10)}`;
    await storage.putFile(clipKeys.original(clipId), clip);
    const progress: ExtractProgress[] = [];
    const r = await extractClipFrames({ media: media(), storage }, { clipId, probe: p, progressIntervalMs: 0, onProgress: (x) => progress.push(x) });

    expect(r.frameCount).toBe(120);
    expect(r.frameTimes).toHaveLength(120);
    expect(await frameKeys(storage, clipId)).toEqual(allFrameNames(120));
    expect(r.stripKey).toBe(clipKeys.strip(clipId));
    expect(await storage.exists(clipKeys.strip(clipId))).toBe(true);
    expect(r.firstFrameMs).not.toBeNull();

    const done = progress.map((x) => x.framesDone);
    expect(done).toEqual([...done].sort((a, b) => a - b));
    expect(progress.at(-1)).toEqual({ framesDone: 120, totalFrames: 120, percent: 100 });
    expect((await readdir(path.join(dir, "jobs"))).filter((n) => n.startsWith(JOB_DIR_PREFIX))).toEqual([]);
  });
});

describe("job folders on local disk", () => {
  it("default to a folder inside the storage root (frames move by rename) and are removed", async () => {
    const root = path.join(dir, "uploads-jobs");
    const storage = new LocalDiskStorage({ root });
    const plain = testMedia(); // no tmpRoot
    expect(jobTmpRoot(plain, storage)).toBe(path.join(root, ".jobs"));
    expect(jobTmpRoot(plain, s3.storage())).toBeUndefined();
    await storage.putFile(clipKeys.original("c-jobs"), clip);
    let sawJobDir = false;
    await extractClipFrames({ media: plain, storage }, {
      clipId: "c-jobs", probe: p, strip: false, progressIntervalMs: 0,
      onProgress: () => { sawJobDir ||= existsSync(path.join(root, ".jobs")) && readdirSync(path.join(root, ".jobs")).length === 1; },
    });
    expect(sawJobDir).toBe(true);
    expect(await readdir(path.join(root, ".jobs"))).toEqual([]);
    expect(await frameKeys(storage, "c-jobs")).toEqual(allFrameNames(120));
  });
});

describe("a worker interrupted mid-extraction", () => {
  it("ends complete after the retry, with no duplicate or stale frames", async () => {
    const storage = new LocalDiskStorage({ root: path.join(dir, "uploads-retry") });
    const clipId = "c-retry";
    await storage.putFile(clipKeys.original(clipId), clip);
    // Left over from an older, longer extraction of this clip.
    await storage.putStream(clipKeys.frame(clipId, 500, "jpg"), Readable.from([Buffer.from("stale")]));

    const ac = new AbortController();
    const first = await extractClipFrames({ media: media(), storage }, {
      clipId, probe: p, signal: ac.signal, progressIntervalMs: 0,
      onProgress: (x) => { if (x.framesDone >= 30) ac.abort(); },
    }).catch((e) => e);
    expect(first).toBeInstanceOf(FfmpegError);
    expect(first.kind).toBe("aborted");
    const partial = (await frameKeys(storage, clipId)).length;
    expect(partial).toBeGreaterThanOrEqual(31); // 30+ frames and the stale one
    expect(partial).toBeLessThan(121);

    const r = await extractClipFrames({ media: media(), storage }, { clipId, probe: p });
    expect(r.frameCount).toBe(120);
    expect(r.staleFramesRemoved).toBe(1);
    expect(await frameKeys(storage, clipId)).toEqual(allFrameNames(120));
  });

  it("after a cancel, deleting the clip leaves no file behind", async () => {
    const storage = new LocalDiskStorage({ root: path.join(dir, "uploads-delete") });
    const clipId = "c-delete";
    await storage.putFile(clipKeys.original(clipId), clip);
    const ac = new AbortController();
    await extractClipFrames({ media: media(), storage }, {
      clipId, probe: p, signal: ac.signal, uploadConcurrency: 4, progressIntervalMs: 0,
      onProgress: (x) => { if (x.framesDone >= 10) ac.abort(); },
    }).catch(() => undefined);
    await storage.deletePrefix(clipKeys.prefix(clipId));
    expect(existsSync(path.join(dir, "uploads-delete", "clips", clipId))).toBe(false);
  });

  it("a clip without a stored original is refused before ffmpeg runs", async () => {
    const storage = new LocalDiskStorage({ root: path.join(os.tmpdir(), "lf-never-created") });
    await expect(extractClipFrames({ media: media(), storage }, { clipId: "c-none", probe: p })).rejects.toMatchObject({ code: "not_found" });
  });
});
