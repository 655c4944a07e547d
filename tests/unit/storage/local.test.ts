// LocalDiskStorage on real folders: an unwritable folder and a full disk give clear errors and
// leave no partial file behind. As root, permissions do not stop writes, so the folder is made
// immutable (chattr +i) instead, and the full disk is a tiny tmpfs mounted for the test.
import { execa } from "execa";
import { mkdir, readdir, readFile, utimes, writeFile } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LocalDiskStorage } from "../../../server/storage";
import { tempDir } from "../media/helpers";
import { storageError } from "./expect-error";

const isRoot = process.getuid?.() === 0;
let dir: string;
let cleanup: () => Promise<void>;
beforeAll(async () => ({ dir, cleanup } = await tempDir("local")));
afterAll(() => cleanup());

async function lockFolder(p: string): Promise<() => Promise<void>> {
  if (isRoot) {
    await execa("chattr", ["+i", p]);
    return async () => void (await execa("chattr", ["-i", p]));
  }
  await execa("chmod", ["0555", p]);
  return async () => void (await execa("chmod", ["0755", p]));
}


const partials = async (root: string) => readdir(path.join(root, ".partial")).catch(() => [] as string[]);

describe("LocalDiskStorage failures", () => {
  it("an unwritable storage folder is named in the error", async () => {
    const root = path.join(dir, "locked");
    await mkdir(root);
    const unlock = await lockFolder(root);
    try {
      const err = await storageError(new LocalDiskStorage({ root }).putStream("clips/c1/original", Readable.from([Buffer.from("x")])), "unwritable");
      expect(err.message).toContain(root);
      expect(err.message).toMatch(/not writable/);
      expect(err.retryable).toBe(false);
    } finally {
      await unlock();
    }
    expect(await readdir(root)).toEqual([]);
  });

  it("an unwritable destination folder leaves no partial file", async () => {
    const root = path.join(dir, "locked-dest");
    const storage = new LocalDiskStorage({ root });
    await storage.putStream("clips/c1/original", Readable.from([Buffer.from("first")]));
    const unlock = await lockFolder(path.join(root, "clips", "c1"));
    try {
      await storageError(storage.putStream("clips/c1/strip.jpg", Readable.from([Buffer.from("x".repeat(1000))])), "unwritable");
    } finally {
      await unlock();
    }
    expect(await partials(root)).toEqual([]);
    expect(await storage.exists("clips/c1/strip.jpg")).toBe(false);
  });

  it.runIf(isRoot)("a full disk is reported as disk_full and the partial file is removed", async () => {
    const root = path.join(dir, "tiny");
    await mkdir(root);
    await execa("mount", ["-t", "tmpfs", "-o", "size=256k", "tmpfs", root]);
    try {
      const storage = new LocalDiskStorage({ root });
      const err = await storageError(storage.putStream("clips/c1/original", Readable.from([Buffer.alloc(1024 * 1024)])), "disk_full");
      expect(err.message).toMatch(/full/);
      expect(err.retryable).toBe(true);
      expect(await partials(root)).toEqual([]);
      expect(await storage.exists("clips/c1/original")).toBe(false);
      expect(await storage.freeBytes()).toBeGreaterThan(200 * 1024);
    } finally {
      await execa("umount", [root]);
    }
  });
});

describe("LocalDiskStorage specifics", () => {
  it("keeps objects under the root at the key's path, which ffmpeg can read directly", async () => {
    const root = path.join(dir, "plain");
    const storage = new LocalDiskStorage({ root });
    await storage.putStream("clips/c2/original", Readable.from([Buffer.from("video bytes")]));
    expect(storage.localPath("clips/c2/original")).toBe(path.join(root, "clips", "c2", "original"));
    expect(await readFile(storage.localPath("clips/c2/original"), "utf8")).toBe("video bytes");
    expect(await storage.freeBytes()).toBeGreaterThan(0);
  });

  it("sweeps partial files left by a process that died mid-write", async () => {
    const root = path.join(dir, "sweep");
    const storage = new LocalDiskStorage({ root });
    await mkdir(path.join(root, ".partial"), { recursive: true });
    await writeFile(path.join(root, ".partial", "old"), "x");
    await writeFile(path.join(root, ".partial", "fresh"), "x");
    const hourAgo = new Date(Date.now() - 3600_000);
    await utimes(path.join(root, ".partial", "old"), hourAgo, hourAgo);
    expect(await storage.sweepPartials(60_000)).toBe(1);
    expect(await partials(root)).toEqual(["fresh"]);
  });
});
