// Stored objects over HTTP: frames and strips with long-lived cache headers, originals with
// byte ranges (RFC 9110 §14) so a video element can seek without downloading everything.
import type { Request, Response } from "express";
import { pipeline } from "node:stream/promises";
import { HttpError } from "../http/problem";
import { StorageError, type ByteRange } from "../storage";
import { storage } from "./deps";

export const IMMUTABLE = "private, max-age=31536000, immutable";

/** One "bytes=a-b" / "bytes=a-" / "bytes=-n" range; null for none or several (answered whole). */
export function parseRange(header: string | undefined, size: number): ByteRange | "unsatisfiable" | null {
  if (!header) return null;
  const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
  if (!m) return null;
  const [, a, b] = m;
  if (a === "" && b === "") return null;
  if (a === "") {
    const n = Number(b);
    if (n === 0) return "unsatisfiable";
    return { start: Math.max(0, size - n), end: size - 1 };
  }
  const start = Number(a);
  const end = b === "" ? size - 1 : Math.min(Number(b), size - 1);
  if (start >= size || end < start) return "unsatisfiable";
  return { start, end };
}

async function send(res: Response, key: string, headers: Record<string, string>, range?: ByteRange) {
  const obj = await storage().get(key, range);
  res.set(headers);
  res.set("X-Content-Type-Options", "nosniff");
  res.set("Content-Length", String(obj.contentLength));
  if (range) {
    res.status(206).set("Content-Range", `bytes ${obj.start}-${obj.end}/${obj.size}`);
  }
  await pipeline(obj.body, res).catch(() => obj.body.destroy());
}

/** An image that never changes once written; 404 (not cached) while it does not exist yet. */
export async function sendImage(res: Response, key: string, contentType: string, missing: HttpError) {
  try {
    await send(res, key, { "Content-Type": contentType, "Cache-Control": IMMUTABLE });
  } catch (err) {
    if (err instanceof StorageError && err.code === "not_found") {
      res.set("Cache-Control", "no-store");
      throw missing;
    }
    throw err;
  }
}

const contentDisposition = (name: string) => {
  const ascii = name.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return `inline; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
};

export async function sendOriginal(req: Request, res: Response, key: string, contentType: string, name: string) {
  const head = await storage().stat(key);
  if (!head) throw new HttpError(404, "not_found", "The original file of this clip is missing.");
  const headers = { "Content-Type": contentType, "Accept-Ranges": "bytes", "Cache-Control": IMMUTABLE, "Content-Disposition": contentDisposition(name) };
  const range = parseRange(req.get("range"), head.size);
  if (range === "unsatisfiable") {
    res.status(416).set({ ...headers, "Content-Range": `bytes */${head.size}` }).end();
    return;
  }
  if (req.method === "HEAD") {
    res.set({ ...headers, "Content-Length": String(head.size) }).end();
    return;
  }
  await send(res, key, headers, range ?? undefined);
}

/** A MIME type for the original, from ffprobe's container name. */
export function videoMime(formatName: string | undefined): string {
  const f = formatName ?? "";
  if (f.includes("mp4") || f.includes("mov")) return "video/mp4";
  if (f.includes("webm")) return "video/webm";
  if (f.includes("matroska")) return "video/x-matroska";
  if (f.includes("avi")) return "video/x-msvideo";
  return "application/octet-stream";
}
