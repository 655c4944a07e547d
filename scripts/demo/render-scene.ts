// Renders synthetic shot scenes (shot-scene.ts) to frames with sharp and encodes them with the
// system ffmpeg, through the project's one ffmpeg wrapper, into an H.264 MP4 stored at 30 fps (as
// a high-speed camera's file would be: the capture rate lives with the clip, not in the file).
// Renders are cached by their options in the OS temp folder, so seeding twice renders once.
import { createHash } from "node:crypto";
import { copyFile, mkdir, rename, rm, stat, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import sharp from "sharp";
import { buildFfmpegArgs } from "../../server/media/command";
import { runTool, type MediaConfig } from "../../server/media/ffmpeg";
import type { Landmark, Mark } from "../../shared/schemas/shot-document";
import { shotScene, type SceneOptions, type SceneTruth } from "./shot-scene";

/** Bump when the drawing changes, so cached renders are made again. */
const RENDER_VERSION = 3;
export const STORED_FPS = 30;

/** How the camera spoils the picture: motion blur, focus blur, sensor noise, compression. */
export interface RenderLook {
  /** Shutter open for this share of the frame interval, centred on the frame time (motion blur). Default 0. */
  exposure?: number;
  /** Renders averaged over the exposure (default 4 when exposure > 0). */
  subframes?: number;
  /** Gaussian focus blur, sigma in px (ffmpeg gblur). */
  blurSigma?: number;
  /** Temporal sensor noise, ffmpeg noise filter strength (alls). */
  noise?: number;
  /** H.264 constant rate factor (default 12; 23 is a typical phone's). */
  crf?: number;
}

export interface RenderedClip {
  mp4: string;
  frameCount: number;
  /** One truth per scene, with frames numbered in the whole clip (the first frame is 1). */
  scenes: (SceneTruth & { firstFrame: number; lastFrame: number })[];
}

export function defaultMedia(): MediaConfig {
  return { ffmpegPath: process.env.FFMPEG_PATH ?? "ffmpeg", ffprobePath: process.env.FFPROBE_PATH ?? "ffprobe", niceness: 0, threads: 2 };
}

/** A scene's truth moved to start at clip frame `offset + 1`. */
export function offsetTruth(t: SceneTruth, offset: number): SceneTruth & { firstFrame: number; lastFrame: number } {
  const tracks = Object.fromEntries(Object.entries(t.tracks).map(([k, m]) => [k, m.map(([f, x, y]) => [f + offset, x, y] as Mark)])) as Record<Landmark, Mark[]>;
  const e = t.events;
  return {
    ...t,
    tracks,
    events: { iceStrike: e.iceStrike + offset, puckStrike: e.puckStrike + offset, peakBend: e.peakBend + offset, release: e.release + offset },
    firstFrame: offset + 1,
    lastFrame: offset + t.frameCount,
  };
}

/** The truths of a clip made of these scenes, without rendering anything. */
export function clipTruth(scenes: SceneOptions[]): RenderedClip["scenes"] {
  let offset = 0;
  return scenes.map((o) => {
    const { truth } = shotScene(o);
    const r = offsetTruth(truth, offset);
    offset += truth.frameCount;
    return r;
  });
}

const exists = (p: string) => stat(p).then(() => true, () => false);

/** Render the scenes one after the other into one MP4 (cached). */
export async function renderClip(
  scenes: SceneOptions[],
  opts: { media?: MediaConfig; cacheDir?: string; jpegQuality?: number; look?: RenderLook } = {},
): Promise<RenderedClip> {
  const look = opts.look ?? {};
  const key = createHash("sha1")
    .update(JSON.stringify({ v: RENDER_VERSION, scenes, q: opts.jpegQuality ?? 92, ...(Object.keys(look).length ? { look } : {}) }))
    .digest("hex")
    .slice(0, 16);
  const dir = path.join(opts.cacheDir ?? path.join(os.tmpdir(), "loadframe-demo-scenes"), key);
  const mp4 = path.join(dir, "clip.mp4");
  const truths = clipTruth(scenes);
  const frameCount = truths.reduce((n, t) => n + t.frameCount, 0);
  if (await exists(mp4)) return { mp4, frameCount, scenes: truths };

  const work = `${dir}.tmp-${process.pid}`;
  await rm(work, { recursive: true, force: true });
  await mkdir(path.join(work, "frames"), { recursive: true });
  let frame = 0;
  for (const o of scenes) {
    const { truth, background, foreground } = shotScene(o);
    // The still parts are rastered once; each frame lays only what moves over them (librsvg
    // gives straight alpha), which is several times quicker than rastering the whole scene.
    const bg = await sharp(Buffer.from(background())).removeAlpha().raw().toBuffer({ resolveWithObject: true });
    const raw = { raw: { width: bg.info.width, height: bg.info.height, channels: 3 as const } };
    // Motion blur: the moving parts rendered at `subframes` instants across the exposure and averaged.
    const exposure = look.exposure ?? 0;
    const subs = exposure > 0 ? Math.max(2, look.subframes ?? 4) : 1;
    const instants = Array.from({ length: subs }, (_, i) => (subs === 1 ? 0 : exposure * ((i + 0.5) / subs - 0.5)));
    const one = async (f: number, out: string) => {
      // One instant: libvips lays the moving parts over the still ones (several times quicker
      // than the loop below, which only motion blur needs).
      if (subs === 1) {
        await sharp(bg.data, raw).composite([{ input: Buffer.from(foreground(f)) }]).jpeg({ quality: opts.jpegQuality ?? 92, chromaSubsampling: "4:4:4" }).toFile(out);
        return;
      }
      const sum = new Float32Array(bg.data.length);
      for (const dt of instants) {
        const fg = await sharp(Buffer.from(foreground(f + dt))).raw().toBuffer();
        for (let i = 0, j = 0; i < fg.length; i += 4, j += 3) {
          const k = fg[i + 3] / 255;
          sum[j] += fg[i] * k + bg.data[j] * (1 - k);
          sum[j + 1] += fg[i + 1] * k + bg.data[j + 1] * (1 - k);
          sum[j + 2] += fg[i + 2] * k + bg.data[j + 2] * (1 - k);
        }
      }
      const img = Buffer.alloc(sum.length);
      for (let j = 0; j < sum.length; j++) img[j] = sum[j] / subs;
      await sharp(img, raw).jpeg({ quality: opts.jpegQuality ?? 92, chromaSubsampling: "4:4:4" }).toFile(out);
    };
    const jobs: Promise<unknown>[] = [];
    for (let f = 1; f <= truth.frameCount; f++) {
      frame++;
      jobs.push(one(f, path.join(work, "frames", `${String(frame).padStart(6, "0")}.jpg`)));
      if (jobs.length >= 3) await Promise.all(jobs.splice(0));
    }
    await Promise.all(jobs);
  }
  const filters = [
    ...(look.blurSigma ? [`gblur=sigma=${look.blurSigma}`] : []),
    ...(look.noise ? [`noise=alls=${look.noise}:allf=t`] : []),
  ];
  const args = buildFfmpegArgs({
    inputs: [{ path: path.join(work, "frames", "%06d.jpg"), options: ["-framerate", String(STORED_FPS)] }],
    outputs: [
      {
        path: path.join(work, "clip.mp4"),
        options: [
          ...(filters.length ? ["-vf", filters.join(",")] : []),
          "-c:v", "libx264", "-preset", "veryfast", "-crf", String(look.crf ?? 12), "-pix_fmt", "yuv420p", "-movflags", "+faststart",
        ],
      },
    ],
  });
  await runTool(opts.media ?? defaultMedia(), { tool: "ffmpeg", args, timeoutMs: 300_000 });
  await mkdir(dir, { recursive: true });
  await rename(path.join(work, "clip.mp4"), mp4);
  await writeFile(path.join(dir, "scenes.json"), JSON.stringify(scenes));
  await rm(work, { recursive: true, force: true });
  return { mp4, frameCount, scenes: truths };
}

/** A private copy of a rendered clip (ingest moves the file it is given). */
export async function copyOf(mp4: string, to: string) {
  await copyFile(mp4, to);
  return to;
}
