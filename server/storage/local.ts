// Objects as files under one root folder (default uploads/). Writes go to <root>/.partial and
// are renamed into place, so a key is either absent or complete; every failure path removes the
// partial file.
import { randomUUID } from "node:crypto";
import { createReadStream, createWriteStream } from "node:fs";
import { mkdir, readdir, rename, rm, stat, statfs, unlink } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { HashingStream, sha256File } from "./hash";
import { validateKey, validatePrefix } from "./keys";
import {
  resolveRange,
  StorageError,
  type ByteRange,
  type GetResult,
  type PutFileOptions,
  type PutOptions,
  type PutResult,
  type Storage,
  type StoredObject,
} from "./types";

const PARTIAL = ".partial";

export class LocalDiskStorage implements Storage {
  readonly kind = "local" as const;
  readonly root: string;
  private readonly partialDir: string;

  constructor(opts: { root?: string } = {}) {
    this.root = path.resolve(opts.root ?? "uploads");
    this.partialDir = path.join(this.root, PARTIAL);
  }

  private pathOf(key: string): string {
    return path.join(this.root, ...validateKey(key).split("/"));
  }

  private wrap(err: unknown, key: string): StorageError {
    if (err instanceof StorageError) return err;
    const code = (err as NodeJS.ErrnoException)?.code ?? "";
    if (code === "EACCES" || code === "EPERM" || code === "EROFS") {
      return new StorageError("unwritable", `The storage folder ${this.root} is not writable (${code}); check its owner and permissions.`, { key }, { cause: err });
    }
    if (code === "ENOSPC" || code === "EDQUOT") {
      return new StorageError("disk_full", `The disk holding ${this.root} is full (${code}); free some space or move the storage folder to a larger disk.`, { key }, { cause: err });
    }
    if (code === "ENOENT" || code === "ENOTDIR") return new StorageError("not_found", `No object ${key}`, { key }, { cause: err });
    return new StorageError("io_error", `Storage error on ${key}: ${(err as Error)?.message ?? String(err)}`, { key }, { cause: err });
  }

  // Rename first and create the folder only when missing: one system call per frame, not three.
  private async commit(tmp: string, dest: string) {
    try {
      await rename(tmp, dest);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "ENOENT") throw err;
      await mkdir(path.dirname(dest), { recursive: true });
      await rename(tmp, dest);
    }
  }

  async putStream(key: string, body: Readable, opts: PutOptions = {}): Promise<PutResult> {
    const dest = this.pathOf(key);
    const tmp = path.join(this.partialDir, randomUUID());
    const counter = new HashingStream({ hash: opts.hash === true, maxBytes: opts.maxBytes });
    try {
      await mkdir(this.partialDir, { recursive: true });
      await pipeline(body, counter, createWriteStream(tmp, { flags: "wx" }));
      await this.commit(tmp, dest);
      return { key, size: counter.bytes, ...(opts.hash ? { sha256: counter.sha256 } : {}) };
    } catch (err) {
      body.destroy();
      await rm(tmp, { force: true }).catch(() => undefined);
      throw this.wrap(err, key);
    }
  }

  async putFile(key: string, file: string, opts: PutFileOptions = {}): Promise<PutResult> {
    const dest = this.pathOf(key);
    if (!opts.move) return this.putStream(key, createReadStream(file), opts);
    try {
      const { size } = await stat(file);
      if (opts.maxBytes !== undefined && size > opts.maxBytes) {
        throw new StorageError("too_large", `More than ${opts.maxBytes} bytes`, { maxBytes: opts.maxBytes });
      }
      const sha256 = opts.hash ? (await sha256File(file)).sha256 : undefined;
      try {
        await this.commit(file, dest);
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code !== "EXDEV") throw err;
        // Another file system: copy through .partial, then drop the source.
        await this.putStream(key, createReadStream(file));
        await unlink(file);
      }
      return { key, size, ...(sha256 ? { sha256 } : {}) };
    } catch (err) {
      throw this.wrap(err, key);
    }
  }

  async get(key: string, range?: ByteRange): Promise<GetResult> {
    const p = this.pathOf(key);
    const s = await stat(p).catch((err) => {
      throw this.wrap(err, key);
    });
    if (!s.isFile()) throw new StorageError("not_found", `No object ${key}`, { key });
    const { start, end } = resolveRange(key, s.size, range);
    const body = s.size === 0 ? Readable.from([]) : createReadStream(p, { start, end });
    return { body, size: s.size, start, end, contentLength: end - start + 1 };
  }

  async stat(key: string): Promise<StoredObject | null> {
    try {
      const s = await stat(this.pathOf(key));
      return s.isFile() ? { key, size: s.size, modifiedAt: s.mtime } : null;
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      if (code === "ENOENT" || code === "ENOTDIR") return null;
      throw this.wrap(err, key);
    }
  }

  async exists(key: string): Promise<boolean> {
    return (await this.stat(key)) !== null;
  }

  async list(prefix: string): Promise<StoredObject[]> {
    validatePrefix(prefix);
    const out: StoredObject[] = [];
    const walk = async (dir: string, keyPrefix: string): Promise<void> => {
      let entries;
      try {
        entries = await readdir(dir, { withFileTypes: true });
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === "ENOENT") return;
        throw this.wrap(err, keyPrefix);
      }
      for (const e of entries) {
        const key = keyPrefix + e.name;
        if (e.isDirectory()) await walk(path.join(dir, e.name), `${key}/`);
        else if (e.isFile()) {
          const s = await stat(path.join(dir, e.name)).catch(() => null);
          if (s) out.push({ key, size: s.size, modifiedAt: s.mtime });
        }
      }
    };
    await walk(this.pathOf(prefix.slice(0, -1)), prefix);
    return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  }

  async delete(key: string): Promise<void> {
    try {
      await unlink(this.pathOf(key));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "ENOENT") throw this.wrap(err, key);
    }
  }

  async deletePrefix(prefix: string): Promise<number> {
    const n = (await this.list(prefix)).length;
    try {
      await rm(this.pathOf(prefix.slice(0, -1)), { recursive: true, force: true });
    } catch (err) {
      throw this.wrap(err, prefix);
    }
    return n;
  }

  localPath(key: string): string {
    return this.pathOf(key);
  }

  async freeBytes(): Promise<number> {
    let dir = this.root;
    for (;;) {
      try {
        const s = await statfs(dir);
        return s.bavail * s.bsize;
      } catch (err) {
        const parent = path.dirname(dir);
        if ((err as NodeJS.ErrnoException).code !== "ENOENT" || parent === dir) throw this.wrap(err, "");
        dir = parent;
      }
    }
  }

  /** Remove partial writes older than maxAgeMs (left by a process that died mid-write). */
  async sweepPartials(maxAgeMs: number): Promise<number> {
    let names: string[];
    try {
      names = await readdir(this.partialDir);
    } catch {
      return 0;
    }
    let n = 0;
    for (const name of names) {
      const p = path.join(this.partialDir, name);
      const s = await stat(p).catch(() => null);
      if (s && Date.now() - s.mtimeMs > maxAgeMs) {
        await rm(p, { force: true });
        n++;
      }
    }
    return n;
  }
}
