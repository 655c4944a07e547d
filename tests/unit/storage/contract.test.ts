// One contract, two implementations: every case runs against LocalDiskStorage and against
// S3Storage talking to a local S3-compatible fake on loopback.
import { createHash, randomBytes } from "node:crypto";
import { existsSync } from "node:fs";
import { writeFile } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LocalDiskStorage, type Storage } from "../../../server/storage";
import { tempDir } from "../media/helpers";
import { storageError } from "./expect-error";
import { startFakeS3 } from "./fake-s3";

async function bytesOf(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of body) chunks.push(Buffer.from(c));
  return Buffer.concat(chunks);
}
const streamOf = (buf: Buffer, chunk = 64 * 1024) =>
  Readable.from((function* () { for (let i = 0; i < buf.length; i += chunk) yield buf.subarray(i, i + chunk); })());
const sha = (b: Buffer) => createHash("sha256").update(b).digest("hex");


interface Backend {
  name: string;
  start: () => Promise<{ storage: Storage; stop: () => Promise<void> }>;
}

const backends: Backend[] = [
  {
    name: "LocalDiskStorage",
    start: async () => {
      const { dir, cleanup } = await tempDir("local-contract");
      return { storage: new LocalDiskStorage({ root: path.join(dir, "uploads") }), stop: cleanup };
    },
  },
  {
    name: "S3Storage",
    start: async () => {
      const s3 = await startFakeS3();
      return { storage: s3.storage({ partSizeBytes: 5 * 1024 * 1024 }), stop: s3.stop };
    },
  },
];

describe.each(backends)("$name", ({ start }) => {
  let storage: Storage;
  let stop: () => Promise<void>;
  let scratch: { dir: string; cleanup: () => Promise<void> };
  beforeAll(async () => {
    ({ storage, stop } = await start());
    scratch = await tempDir("contract-src");
  });
  afterAll(async () => {
    await stop();
    await scratch.cleanup();
  });

  it("stores a stream, hashing it on the way, and reads it back", async () => {
    // SHA-256("abc"): FIPS 180-2, Appendix B.1.
    const r = await storage.putStream("t/abc.txt", Readable.from([Buffer.from("a"), Buffer.from("bc")]), { hash: true });
    expect(r).toEqual({ key: "t/abc.txt", size: 3, sha256: "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad" });
    const got = await storage.get("t/abc.txt");
    expect((await bytesOf(got.body)).toString()).toBe("abc");
    expect({ size: got.size, start: got.start, end: got.end, contentLength: got.contentLength }).toEqual({ size: 3, start: 0, end: 2, contentLength: 3 });
    expect(await storage.stat("t/abc.txt")).toMatchObject({ key: "t/abc.txt", size: 3 });
    expect(await storage.exists("t/abc.txt")).toBe(true);
  });

  it("stores several parts' worth intact (multipart on S3)", async () => {
    const big = randomBytes(12 * 1024 * 1024 + 123);
    const r = await storage.putStream("t/big.bin", streamOf(big, 1 << 20), { hash: true });
    expect(r.size).toBe(big.length);
    expect(r.sha256).toBe(sha(big)); // Node's crypto as the reference
    expect(sha(await bytesOf((await storage.get("t/big.bin")).body))).toBe(sha(big));
  });

  it("reads byte ranges (inclusive ends, as in HTTP Range, RFC 9110 §14.1.2)", async () => {
    const data = randomBytes(1 << 20);
    await storage.putStream("t/range.bin", streamOf(data));
    const mid = await storage.get("t/range.bin", { start: 1000, end: 1999 });
    expect({ start: mid.start, end: mid.end, contentLength: mid.contentLength, size: mid.size }).toEqual({ start: 1000, end: 1999, contentLength: 1000, size: 1 << 20 });
    expect((await bytesOf(mid.body)).equals(data.subarray(1000, 2000))).toBe(true);

    const tail = await storage.get("t/range.bin", { start: (1 << 20) - 10 });
    expect((await bytesOf(tail.body)).equals(data.subarray(-10))).toBe(true);
    const past = await storage.get("t/range.bin", { start: 5, end: 10 << 20 });
    expect(past.end).toBe((1 << 20) - 1);
    await bytesOf(past.body);

    const err = await storageError(storage.get("t/range.bin", { start: 1 << 20 }), "range_not_satisfiable");
    expect(err.details.size).toBe(1 << 20);
    await storageError(storage.get("t/range.bin", { start: 10, end: 5 }), "range_not_satisfiable");
  });

  it("says clearly when something is not there", async () => {
    expect(await storage.stat("t/none")).toBeNull();
    expect(await storage.exists("t/none")).toBe(false);
    await storageError(storage.get("t/none"), "not_found");
    await expect(storage.delete("t/none")).resolves.toBeUndefined();
  });

  it("lists a prefix, sorted, without its neighbours", async () => {
    for (const k of ["clips/a/frames/000002.jpg", "clips/a/original", "clips/a/frames/000001.jpg", "clips/ab/original"]) {
      await storage.putStream(k, Readable.from([Buffer.from(k)]));
    }
    expect((await storage.list("clips/a/")).map((o) => o.key)).toEqual(["clips/a/frames/000001.jpg", "clips/a/frames/000002.jpg", "clips/a/original"]);
    expect((await storage.list("clips/a/frames/"))[0]).toMatchObject({ size: "clips/a/frames/000001.jpg".length });
    expect(await storage.list("clips/zz/")).toEqual([]);
    await storageError(storage.list("clips/a"), "invalid_key");
  });

  it("deletes a prefix and only that prefix", async () => {
    for (const k of ["del/x/1", "del/x/sub/2", "del/xy/3"]) await storage.putStream(k, Readable.from([Buffer.from("x")]));
    expect(await storage.deletePrefix("del/x/")).toBe(2);
    expect(await storage.list("del/x/")).toEqual([]);
    expect((await storage.list("del/")).map((o) => o.key)).toEqual(["del/xy/3"]);
    await storageError(storage.deletePrefix("del"), "invalid_key");
  });

  it("refuses keys that could leave the storage root or hide as partial files", async () => {
    const bad = ["../escape", "a/../../escape", "/etc/passwd", "a//b", "a/./b", "a\\b", "line\nbreak", "nul\u0000x", ".partial/x", "", "a/b/", "ümlaut"];
    for (const key of bad) {
      await storageError(storage.putStream(key, Readable.from([Buffer.from("x")])), "invalid_key");
      await storageError(storage.get(key), "invalid_key");
    }
    expect(existsSync(path.resolve("escape"))).toBe(false);
  });

  it("overwrites a key in place (a retried frame replaces, never duplicates)", async () => {
    await storage.putStream("t/frame.jpg", Readable.from([Buffer.from("first")]));
    await storage.putStream("t/frame.jpg", Readable.from([Buffer.from("second")]));
    expect((await bytesOf((await storage.get("t/frame.jpg")).body)).toString()).toBe("second");
    expect((await storage.list("t/")).filter((o) => o.key === "t/frame.jpg")).toHaveLength(1);
  });

  it("stores a file by copy or by move", async () => {
    const src = path.join(scratch.dir, "src.bin");
    await writeFile(src, "file body");
    expect(await storage.putFile("f/copy", src, { hash: true })).toMatchObject({ size: 9, sha256: sha(Buffer.from("file body")) });
    expect(existsSync(src)).toBe(true);
    expect(await storage.putFile("f/moved", src, { move: true, hash: true })).toMatchObject({ size: 9, sha256: sha(Buffer.from("file body")) });
    expect(existsSync(src)).toBe(false);
    expect((await bytesOf((await storage.get("f/moved")).body)).toString()).toBe("file body");
  });

  it("stores nothing when the body is too large or breaks off", async () => {
    await storageError(storage.putStream("n/too-big", streamOf(randomBytes(300_000)), { maxBytes: 100_000 }), "too_large");
    expect(await storage.exists("n/too-big")).toBe(false);

    const broken = new Readable({
      read() {
        this.push(randomBytes(6 * 1024 * 1024)); // past one S3 part, so a multipart upload is open
        this.destroy(new Error("network aborted"));
      },
    });
    await expect(storage.putStream("n/broken", broken)).rejects.toThrow(/network aborted/);
    expect(await storage.exists("n/broken")).toBe(false);
    expect(await storage.list("n/")).toEqual([]);
  });

  it("reads an empty object", async () => {
    await storage.putStream("t/empty", Readable.from([]));
    const got = await storage.get("t/empty");
    expect({ size: got.size, contentLength: got.contentLength }).toEqual({ size: 0, contentLength: 0 });
    expect((await bytesOf(got.body)).length).toBe(0);
  });
});
