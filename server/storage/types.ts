// The one storage interface: originals, frames and strips are put, read (whole or by byte range),
// listed and deleted by key. Keys are built from ids (see keys.ts), never from client file names.
import type { Readable } from "node:stream";

export interface StoredObject {
  key: string;
  size: number;
  modifiedAt: Date;
}

export interface PutOptions {
  contentType?: string;
  /** Compute the SHA-256 of the bytes while storing them. */
  hash?: boolean;
  /** Refuse (and store nothing) once more bytes than this arrive. */
  maxBytes?: number;
}

export interface PutFileOptions extends PutOptions {
  /** The source file may be moved instead of copied (it is gone afterwards). */
  move?: boolean;
}

export interface PutResult {
  key: string;
  size: number;
  /** Hex digest, when `hash` was asked for. */
  sha256?: string;
}

/** Inclusive byte positions, as in an HTTP Range header; `end` defaults to the last byte. */
export interface ByteRange {
  start: number;
  end?: number;
}

export interface GetResult {
  body: Readable;
  /** Size of the whole object. */
  size: number;
  start: number;
  end: number;
  contentLength: number;
  contentType?: string;
}

export interface Storage {
  readonly kind: "local" | "s3";
  putStream(key: string, body: Readable, opts?: PutOptions): Promise<PutResult>;
  putFile(key: string, file: string, opts?: PutFileOptions): Promise<PutResult>;
  /** Throws StorageError not_found / range_not_satisfiable. */
  get(key: string, range?: ByteRange): Promise<GetResult>;
  /** null when there is no such object. */
  stat(key: string): Promise<StoredObject | null>;
  exists(key: string): Promise<boolean>;
  /** Every object whose key starts with `prefix` (which must end with "/"), sorted by key. */
  list(prefix: string): Promise<StoredObject[]>;
  delete(key: string): Promise<void>;
  /** Deletes everything under `prefix` (which must end with "/"); returns how many objects went. */
  deletePrefix(prefix: string): Promise<number>;
  /** A path ffmpeg can read directly, when the object is a local file; else null. */
  localPath(key: string): string | null;
  /** Free bytes where objects are written, when knowable (local disk); else null. */
  freeBytes(): Promise<number | null>;
}

export type StorageErrorCode =
  | "invalid_key"
  | "not_found"
  | "range_not_satisfiable"
  | "too_large"
  | "unwritable"
  | "disk_full"
  | "io_error";

const retryableCodes: ReadonlySet<StorageErrorCode> = new Set(["disk_full", "io_error"]);

export class StorageError extends Error {
  readonly retryable: boolean;
  constructor(
    readonly code: StorageErrorCode,
    message: string,
    readonly details: Record<string, unknown> = {},
    options?: { cause?: unknown },
  ) {
    super(message, options);
    this.name = "StorageError";
    this.retryable = retryableCodes.has(code);
  }
}

/** Clamp a requested range to an object of `size` bytes, or throw range_not_satisfiable. */
export function resolveRange(key: string, size: number, range: ByteRange | undefined): { start: number; end: number } {
  if (!range) return { start: 0, end: size - 1 }; // end -1 for an empty object
  const { start } = range;
  const end = Math.min(range.end ?? size - 1, size - 1);
  if (!Number.isInteger(start) || start < 0 || start >= size || end < start) {
    throw new StorageError("range_not_satisfiable", `Bytes ${start}-${range.end ?? ""} are outside ${key} (${size} bytes)`, {
      size,
    });
  }
  return { start, end };
}
