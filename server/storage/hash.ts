// SHA-256 of bytes on their way into storage, so a 4 GB original is read once, not twice.
import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import { Transform, type TransformCallback } from "node:stream";
import { pipeline } from "node:stream/promises";
import { StorageError } from "./types";

/**
 * A pass-through stream that hashes and counts what flows through it. With maxBytes it fails
 * with too_large as soon as more arrives, so the caller can abort before storing it all.
 */
export class HashingStream extends Transform {
  private readonly hash = createHash("sha256");
  bytes = 0;
  private digestHex: string | undefined;

  constructor(private readonly opts: { hash?: boolean; maxBytes?: number } = {}) {
    super();
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback) {
    this.bytes += chunk.length;
    if (this.opts.maxBytes !== undefined && this.bytes > this.opts.maxBytes) {
      cb(new StorageError("too_large", `More than ${this.opts.maxBytes} bytes`, { maxBytes: this.opts.maxBytes }));
      return;
    }
    if (this.opts.hash !== false) this.hash.update(chunk);
    cb(null, chunk);
  }

  override _flush(cb: TransformCallback) {
    if (this.opts.hash !== false) this.digestHex = this.hash.digest("hex");
    cb();
  }

  /** Hex digest; only after the stream has ended. */
  get sha256(): string | undefined {
    return this.digestHex;
  }
}

export async function sha256File(file: string): Promise<{ sha256: string; size: number }> {
  const h = new HashingStream();
  h.resume();
  await pipeline(createReadStream(file), h);
  return { sha256: h.sha256!, size: h.bytes };
}
