// The storage and media configuration clip ingest runs with, built once from the environment.
import path from "node:path";
import { env } from "../env";
import { log } from "../log";
import type { MediaConfig } from "../media/ffmpeg";
import { createStorage, type Storage } from "../storage";

let cachedStorage: Storage | undefined;
export function storage(): Storage {
  if (cachedStorage) return cachedStorage;
  const e = env();
  cachedStorage =
    e.STORAGE === "s3"
      ? createStorage({
          kind: "s3",
          bucket: e.S3_BUCKET,
          endpoint: e.S3_ENDPOINT,
          region: e.S3_REGION,
          credentials: e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY } : undefined,
        })
      : createStorage({ kind: "local", root: e.UPLOAD_DIR });
  return cachedStorage;
}

/** Unfinished resumable uploads (always local disk: tus writes at an offset). */
export const tusDir = () => path.resolve(env().UPLOAD_DIR, ".tus");

/**
 * Per-job temp folders sit beside the stored objects, so with local storage a finished frame is
 * renamed into place rather than copied.
 */
export const jobTmpRoot = () => path.resolve(env().UPLOAD_DIR, ".jobs");

export function mediaConfig(): MediaConfig {
  const e = env();
  return { ffmpegPath: e.FFMPEG_PATH, ffprobePath: e.FFPROBE_PATH, tmpRoot: jobTmpRoot(), logger: log };
}

/** Only for tests that swap the storage (e.g. an S3-compatible fake). */
export function setStorageForTests(s: Storage | undefined) {
  cachedStorage = s;
}
