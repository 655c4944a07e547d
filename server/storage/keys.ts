// Storage keys. Every key is built from ids by the functions below; nothing a client sends (its
// file name above all) ever becomes part of a key. validateKey is the last line of defence in
// both storage implementations.
import { StorageError } from "./types";

const segment = /^[A-Za-z0-9_][A-Za-z0-9._-]{0,127}$/;
const idPattern = /^[A-Za-z0-9_-]{1,64}$/;

/** Throws invalid_key unless `key` is "seg/seg/…" of plain segments (no "..", no leading "/" or ".", no "\\"). */
export function validateKey(key: string): string {
  const parts = key.split("/");
  if (key.length === 0 || key.length > 512 || !parts.every((p) => segment.test(p) && !/^\.+$/.test(p))) {
    throw new StorageError("invalid_key", `Not a valid storage key: ${JSON.stringify(key.slice(0, 80))}`);
  }
  return key;
}

/** Throws invalid_key unless `prefix` is a valid key path ending in "/". */
export function validatePrefix(prefix: string): string {
  if (!prefix.endsWith("/")) {
    throw new StorageError("invalid_key", `A storage prefix must end with "/": ${JSON.stringify(prefix.slice(0, 80))}`);
  }
  validateKey(prefix.slice(0, -1));
  return prefix;
}

function id(value: string): string {
  if (!idPattern.test(value)) throw new StorageError("invalid_key", `Not a valid id for a storage key: ${JSON.stringify(value.slice(0, 80))}`);
  return value;
}

export type ImageExt = "jpg" | "webp";

/** clips/<clipId>/original, clips/<clipId>/frames/000001.jpg, clips/<clipId>/strip.jpg */
export const clipKeys = {
  prefix: (clipId: string) => `clips/${id(clipId)}/`,
  original: (clipId: string) => `clips/${id(clipId)}/original`,
  framesPrefix: (clipId: string) => `clips/${id(clipId)}/frames/`,
  frame: (clipId: string, index: number, ext: ImageExt) => {
    if (!Number.isInteger(index) || index < 1) throw new StorageError("invalid_key", `Frame index must be 1 or more, got ${index}`);
    return `clips/${id(clipId)}/frames/${String(index).padStart(6, "0")}.${ext}`;
  },
  strip: (clipId: string) => `clips/${id(clipId)}/strip.jpg`,
};

/** Frame index from a frame key or file name ("…/000042.jpg" → 42), else null. */
export function frameIndexOf(keyOrName: string): number | null {
  const m = /(?:^|\/)(\d{6,})\.(jpg|webp)$/.exec(keyOrName);
  return m ? Number(m[1]) : null;
}

/**
 * A client's file name made safe to show and to keep as a label: no folders, no control or
 * bidirectional-override characters, at most 200 characters. Never use it as a key.
 */
export function displayFileName(name: string): string {
  const base = name.split(/[/\\]/).pop() ?? "";
  const cleaned = base
    .replace(/[\p{Cc}\p{Cf}\u2028\u2029]/gu, "")
    .replace(/\s+/g, " ")
    .trim()
    .slice(0, 200);
  return cleaned === "" || /^\.+$/.test(cleaned) ? "clip" : cleaned;
}
