// Shared by the clip API tests: a private upload folder per test file (import this module
// first), media files generated with the system ffmpeg, and uploads through tus-js-client.
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import * as tus from "tus-js-client";
import type { Client } from "./helpers";

export const uploadDir = mkdtempSync(path.join(os.tmpdir(), "lf-clips-"));
process.env.UPLOAD_DIR = uploadDir;
export const mediaDir = mkdtempSync(path.join(os.tmpdir(), "lf-media-"));

export const ffmpeg = (...args: string[]) => execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", ...args]);

/** An H.264 MP4 of the lavfi test pattern (moov at the end unless faststart). */
export function makeClip(name: string, o: { frames?: number; fps?: number; size?: string; extra?: string[]; vf?: string; faststart?: boolean } = {}) {
  const file = path.join(mediaDir, name);
  const fps = o.fps ?? 30;
  ffmpeg(
    "-f", "lavfi", "-i", `testsrc2=size=${o.size ?? "320x180"}:rate=${fps}`,
    "-frames:v", String(o.frames ?? 30),
    ...(o.vf ? ["-vf", o.vf] : []),
    "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", "-g", "10",
    ...(o.faststart ? ["-movflags", "+faststart"] : []),
    ...(o.extra ?? []),
    file,
  );
  return file;
}

export const cookieOf = (c: Client) => [...(c as unknown as { cookies: Map<string, string> }).cookies].map(([k, v]) => `${k}=${v}`).join("; ");

/** The headers every raw tus request of these tests sends. */
export const tusHeaders = (who: Client) => ({ "tus-resumable": "1.0.0", cookie: cookieOf(who), origin: "http://127.0.0.1:3000" });

/** Starts an upload with a raw tus POST; answers its location (a path). */
export async function createUpload(base: string, who: Client, size: number, metadata: Record<string, string>): Promise<string> {
  const r = await fetch(`${base}/api/uploads`, {
    method: "POST",
    headers: { ...tusHeaders(who), "upload-length": String(size), "upload-metadata": Object.entries(metadata).map(([k, v]) => `${k} ${Buffer.from(v).toString("base64")}`).join(",") },
  });
  if (r.status !== 201) throw new Error(`upload not created: ${r.status} ${await r.text()}`);
  return r.headers.get("location")!;
}

export interface UploadOutcome {
  ok: boolean;
  status?: number;
  body?: any;
  url?: string | null;
}

export function clipMeta(over: Record<string, unknown> = {}) {
  return { title: "", newSession: { date: "2026-03-14", venue: "Lakeport rink", drill: "Slap shots from the point" }, shotType: "slap", cameraView: "side", ...over };
}

/** Upload with tus-js-client; resolves with the finish response body or the problem body. */
export function tusUpload(
  base: string,
  who: Client,
  file: Buffer | string,
  metadata: Record<string, string>,
  opts: Partial<tus.UploadOptions> & { onUpload?: (u: tus.Upload) => void } = {},
): Promise<UploadOutcome> {
  const data = typeof file === "string" ? readFileSync(file) : file;
  const { onUpload, ...tusOpts } = opts;
  return new Promise((resolve) => {
    const u: tus.Upload = new tus.Upload(data, {
      endpoint: `${base}/api/uploads`,
      headers: { cookie: cookieOf(who), origin: "http://127.0.0.1:3000" },
      metadata,
      retryDelays: [],
      chunkSize: 4 * 1024 * 1024,
      ...tusOpts,
      onSuccess: (p) => {
        const text = p.lastResponse.getBody();
        resolve({ ok: true, status: p.lastResponse.getStatus(), body: text ? JSON.parse(text) : null, url: u.url });
      },
      onError: (err) => {
        const res = (err as tus.DetailedError).originalResponse;
        let body: any = null;
        try {
          body = res ? JSON.parse(res.getBody()) : null;
        } catch {
          body = res?.getBody();
        }
        resolve({ ok: false, status: res?.getStatus(), body, url: u.url });
      },
    });
    onUpload?.(u);
    u.start();
  });
}

/** Files left in the tus folder (unfinished or leaked uploads). */
export const tusLeftovers = () => (existsSync(path.join(uploadDir, ".tus")) ? readdirSync(path.join(uploadDir, ".tus")) : []);
/** Stored clip folders. */
export const storedClipDirs = () => (existsSync(path.join(uploadDir, "clips")) ? readdirSync(path.join(uploadDir, "clips")) : []);

export async function waitFor<T>(what: string, fn: () => Promise<T | undefined | null | false>, timeoutMs = 20_000): Promise<T> {
  const t0 = Date.now();
  while (Date.now() - t0 < timeoutMs) {
    const v = await fn();
    if (v) return v;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}
