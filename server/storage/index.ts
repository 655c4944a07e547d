// Storage entry point: the interface, both implementations, keys and the hashing helper.
import { LocalDiskStorage } from "./local";
import { S3Storage, type S3StorageOptions } from "./s3";
import type { Storage } from "./types";

export * from "./types";
export * from "./keys";
export { HashingStream, sha256File } from "./hash";
export { LocalDiskStorage } from "./local";
export { S3Storage, type S3StorageOptions } from "./s3";

export type StorageConfig = { kind: "local"; root?: string } | ({ kind: "s3" } & S3StorageOptions);

/** Build the configured storage (the caller maps env STORAGE / UPLOAD_DIR / S3_* onto this). */
export function createStorage(config: StorageConfig): Storage {
  if (config.kind === "local") return new LocalDiskStorage({ root: config.root });
  const { kind: _kind, ...s3 } = config;
  return new S3Storage(s3);
}
