// Raw grey frames through the one ffmpeg wrapper: the same bytes as the plain ffmpeg command,
// numbered as extraction numbers them (a range keeps the clip's frame numbers), the decoder held
// back by a slow consumer without losing a frame, and clear failures. Source of truth: ffmpeg
// itself (`ffmpeg -i clip -f rawvideo -pix_fmt gray -`) on lavfi-generated clips.
import { execa } from "execa";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import path from "node:path";
import sharp from "sharp";
import { buildGraySpec, decodeGrayFrames, extractFrames, FfmpegError, frameFileName, grayFfmpegArgs, probe } from "../../../server/media";
import { ffmpeg, makeClip, makeRotatedClip, tempDir, testMedia } from "./helpers";

let dir: string;
let cleanup: () => Promise<void>;
let clip: string;
beforeAll(async () => {
  ({ dir, cleanup } = await tempDir("gray"));
  clip = await makeClip(dir, "gray.mp4", { frames: 40, size: "160x90" });
});
afterAll(() => cleanup());

async function plainFfmpeg(file: string): Promise<Buffer> {
  const { stdout } = await execa("ffmpeg", ["-nostdin", "-v", "error", "-i", file, "-fps_mode", "passthrough", "-f", "rawvideo", "-pix_fmt", "gray", "-"], { encoding: "buffer" });
  return Buffer.from(stdout);
}

describe("buildGraySpec", () => {
  it("maps the video stream, trims to the range (0-based, end exclusive) and writes raw grey to the pipe", () => {
    expect(buildGraySpec({ input: "/clips/a.mp4", videoStreamIndex: 1, first: 5, last: 9 }).outputs[0]).toEqual({
      path: "pipe:1",
      options: ["-map", "0:1", "-vf", "trim=start_frame=4:end_frame=9", "-fps_mode", "passthrough", "-f", "rawvideo", "-pix_fmt", "gray"],
    });
  });

  it("takes 8-bit YUV's luma plane as it is, stretched from limited range; other sources keep the conversion", () => {
    const vf = (pixelFormat: string, colorRange: string | null) => {
      const o = buildGraySpec({ input: "/clips/a.mp4", videoStreamIndex: 0, first: 1, last: 9, pixelFormat, colorRange }).outputs[0].options!;
      return o[o.indexOf("-vf") + 1];
    };
    expect(vf("yuv420p", "tv")).toBe("trim=start_frame=0:end_frame=9,extractplanes=y,lut=c0='clip(round((val-16)*255/219),0,255)'");
    expect(vf("yuv420p", null)).toContain("extractplanes=y,lut=");
    expect(vf("yuvj420p", "pc")).toBe("trim=start_frame=0:end_frame=9,extractplanes=y");
    expect(vf("yuv444p", "pc")).toBe("trim=start_frame=0:end_frame=9,extractplanes=y");
    expect(vf("yuv411p", "tv")).toContain("extractplanes=y,lut=");
    for (const f of ["yuv420p10le", "rgb24", "gray16le", "yuva420p", "yuvj411p", "yuvj440p", "bgr24"]) expect(vf(f, "tv")).toBe("trim=start_frame=0:end_frame=9");
  });

  it("lays packed and semi-planar YUV out as planes first, unless a deinterlacer or the widening comes after", () => {
    const vf = (pixelFormat: string, colorRange: string | null, more: { interlaced?: boolean; pixelAspect?: number } = {}) => {
      const o = buildGraySpec({ input: "/clips/a.mov", videoStreamIndex: 0, first: 1, last: 9, pixelFormat, colorRange, ...more }).outputs[0].options!;
      return o[o.indexOf("-vf") + 1];
    };
    expect(vf("uyvy422", "tv")).toBe("trim=start_frame=0:end_frame=9,format=yuv422p,extractplanes=y,lut=c0='clip(round((val-16)*255/219),0,255)'");
    expect(vf("yuyv422", "pc")).toBe("trim=start_frame=0:end_frame=9,format=yuvj422p,extractplanes=y");
    expect(vf("nv12", null)).toBe("trim=start_frame=0:end_frame=9,format=yuv420p,extractplanes=y,lut=c0='clip(round((val-16)*255/219),0,255)'");
    expect(vf("uyvy422", "tv", { interlaced: true })).not.toContain("extractplanes");
    expect(vf("uyvy422", "tv", { pixelAspect: 10 / 11 })).not.toContain("extractplanes");
    expect(vf("uyvy422", "tv", { pixelAspect: 1 })).toContain("extractplanes");
  });
});

describe("grayFfmpegArgs", () => {
  // Decision 147: the tracker works beside the decoder, so frame threads only cost CPU while one
  // thread keeps up; larger frames keep the configured cap.
  const threadsOf = (a: string[]) => ["-threads", "-filter_threads", "-filter_complex_threads"].map((flag) => a.flatMap((x, i) => (x === flag ? [a[i + 1]] : [])));
  it("decodes up to 1280×720 with one thread (decoder and filters), larger frames with the configured cap", () => {
    const at = (width: number, height: number, threads?: number) => threadsOf(grayFfmpegArgs({ threads }, { input: "/clips/a.mp4", videoStreamIndex: 0, first: 1, last: 9, width, height }));
    expect(at(1280, 720)).toEqual([["1", "1"], ["1"], ["1"]]);
    expect(at(720, 1280, 4)).toEqual([["1", "1"], ["1"], ["1"]]);
    expect(at(1920, 1080)).toEqual([["2", "2"], ["2"], ["2"]]);
    expect(at(3840, 2160, 4)).toEqual([["4", "4"], ["4"], ["4"]]);
  });
});

// Each source encoded from the same test picture; the grey frames the job gets must be the bytes
// plain `-pix_fmt gray` gives (swscale's conversion), whichever way they are made.
const SOURCES: { name: string; codec: string[]; luma: boolean; size?: [number, number] }[] = [
  { name: "h264-yuv420p-limited.mp4", codec: ["-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p"], luma: true },
  // NTSC DV (4:1:1) as older lab camcorders write it: DV has fixed frame sizes and rates.
  { name: "dv-ntsc-yuv411p.avi", codec: ["-vf", "scale=720:480,setsar=1", "-r", "30000/1001", "-c:v", "dvvideo", "-pix_fmt", "yuv411p"], luma: true, size: [720, 480] },
  { name: "ffv1-yuv411p-tagged-full.mkv", codec: ["-c:v", "ffv1", "-pix_fmt", "yuv411p", "-color_range", "pc"], luma: true },
  { name: "ffv1-yuv410p-limited.mkv", codec: ["-c:v", "ffv1", "-pix_fmt", "yuv410p"], luma: true },
  { name: "ffv1-yuv440p-limited.mkv", codec: ["-c:v", "ffv1", "-pix_fmt", "yuv440p"], luma: true },
  // Uncompressed captures, packed and semi-planar, in both ranges.
  { name: "raw-uyvy422-limited.mkv", codec: ["-c:v", "rawvideo", "-pix_fmt", "uyvy422"], luma: true },
  { name: "raw-yuyv422-full.mkv", codec: ["-c:v", "rawvideo", "-pix_fmt", "yuyv422", "-color_range", "pc"], luma: true },
  { name: "raw-nv12-limited.mkv", codec: ["-c:v", "rawvideo", "-pix_fmt", "nv12"], luma: true },
  { name: "raw-nv21-full.mkv", codec: ["-c:v", "rawvideo", "-pix_fmt", "nv21", "-color_range", "pc"], luma: true },
  { name: "h264-yuv422p-limited.mkv", codec: ["-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv422p"], luma: true },
  { name: "h264-yuv444p-limited.mkv", codec: ["-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv444p"], luma: true },
  { name: "h264-full-range.mp4", codec: ["-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", "-color_range", "pc"], luma: true },
  { name: "mjpeg-yuvj422p.mkv", codec: ["-c:v", "mjpeg", "-pix_fmt", "yuvj422p"], luma: true },
  { name: "ffv1-yuv420p-tagged-full.mkv", codec: ["-c:v", "ffv1", "-pix_fmt", "yuv420p", "-color_range", "pc"], luma: true },
  { name: "h264-10bit.mkv", codec: ["-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p10le"], luma: false },
  { name: "png-rgb24.mkv", codec: ["-c:v", "png", "-pix_fmt", "rgb24"], luma: false },
];

describe("decodeGrayFrames on other sources", () => {
  it.each(SOURCES)("$name: frame n is plain ffmpeg's grey frame n, byte for byte", async ({ name, codec, luma, size: [width, height] = [256, 128] }) => {
    const file = path.join(dir, name);
    // A ramp across every grey level beside the moving test picture, so each level's mapping is compared.
    await ffmpeg(["-f", "lavfi", "-i", "testsrc2=size=256x96:rate=30[a];gradients=size=256x32:rate=30:c0=black:c1=white:x0=0:y0=0:x1=255:y1=0[b];[a][b]vstack", "-frames:v", "12", ...codec, file]);
    const facts = await probe(testMedia(), file);
    const spec = buildGraySpec({ input: file, videoStreamIndex: facts.videoStreamIndex, first: 3, last: 12, pixelFormat: facts.pixelFormat, colorRange: facts.colorRange });
    expect(spec.outputs[0].options!.join(" ").includes("extractplanes"), `luma plane taken as it is for ${facts.pixelFormat}`).toBe(luma);
    const all = await plainFfmpeg(file);
    const size = width * height;
    const got = new Map<number, Uint8Array>();
    const n = await decodeGrayFrames(testMedia(), {
      input: file, videoStreamIndex: facts.videoStreamIndex, pixelFormat: facts.pixelFormat, colorRange: facts.colorRange,
      first: 3, last: 12, width, height, onFrame: (f, d) => void got.set(f, d),
    });
    expect(n).toBe(10);
    for (const [f, d] of got) expect(Buffer.from(d).equals(all.subarray((f - 1) * size, f * size)), `frame ${f}`).toBe(true);
    // The ramp's row holds many levels, so the comparison covers the range mapping, not one grey.
    const ramp = Math.round((height * 100) / 128);
    expect(new Set(got.get(3)!.subarray(ramp * width, (ramp + 1) * width)).size).toBeGreaterThan(64);
  });
});

describe("decodeGrayFrames on 12-bit data in 16-bit samples", () => {
  it("scales the samples up as the extraction does (decision 138): the full picture's grey, not its dark high byte", async () => {
    // The same picture at full 16 bits and as a camera's 12-bit samples (0–4095) in 16-bit words,
    // both lossless; the stored probe says 12 bits (a PNG sequence's sBIT, clips-sequences.test.ts).
    const src = "testsrc2=size=256x96:rate=30";
    const full = path.join(dir, "gray16-full.mkv");
    const twelve = path.join(dir, "gray16-12bit.mkv");
    await ffmpeg(["-f", "lavfi", "-i", src, "-frames:v", "6", "-vf", "format=gray16le", "-c:v", "ffv1", full]);
    await ffmpeg(["-f", "lavfi", "-i", src, "-frames:v", "6", "-vf", "format=gray16le,lut=c0=val/16", "-c:v", "ffv1", twelve]);
    const reference = await plainFfmpeg(full);
    const size = 256 * 96;
    const decode = async (bitsPerSample: number | null) => {
      const got: Uint8Array[] = [];
      await decodeGrayFrames(testMedia(), { input: twelve, videoStreamIndex: 0, pixelFormat: "gray16le", bitsPerSample, first: 1, last: 6, width: 256, height: 96, onFrame: (_f, d) => void got.push(d) });
      return got;
    };
    const maxDiff = (frames: Uint8Array[]) => Math.max(...frames.map((d, i) => Math.max(...d.map((v, k) => Math.abs(v - reference[i * size + k])))));
    // Scaled up, every pixel within one level of the full picture (the 4 dropped bits can round it).
    const scaled = await decode(12);
    expect(scaled).toHaveLength(6);
    expect(maxDiff(scaled)).toBeLessThanOrEqual(1);
    // Read as 16-bit words, the picture is a sixteenth as bright.
    expect(maxDiff(await decode(null))).toBeGreaterThan(100);
  });
});

describe("decodeGrayFrames", () => {
  it("gives every frame of a range with its clip frame number, byte for byte what ffmpeg gives", async () => {
    const all = await plainFfmpeg(clip);
    const size = 160 * 90;
    const got = new Map<number, Uint8Array>();
    const n = await decodeGrayFrames(testMedia(), { input: clip, videoStreamIndex: 0, first: 11, last: 30, width: 160, height: 90, onFrame: (f, d) => void got.set(f, d) });
    expect(n).toBe(20);
    expect([...got.keys()]).toEqual(Array.from({ length: 20 }, (_, i) => 11 + i));
    for (const [f, d] of got) expect(Buffer.from(d).equals(all.subarray((f - 1) * size, f * size)), `frame ${f}`).toBe(true);
  });

  it("holds the decoder back while the consumer is busy, and loses nothing", async () => {
    const seen: number[] = [];
    await decodeGrayFrames(testMedia(), {
      input: clip, videoStreamIndex: 0, first: 1, last: 40, width: 160, height: 90,
      onFrame: async (f) => {
        seen.push(f);
        await new Promise((r) => setTimeout(r, 5));
      },
    });
    expect(seen).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
  });

  it("frames of a rotated clip come out turned, at the displayed size: plain ffmpeg's bytes, luma plane taken as it is", async () => {
    const rotated = await makeRotatedClip(dir, "rot.mp4", 90, 6);
    const facts = await probe(testMedia(), rotated);
    expect([facts.rotationDeg !== 0, facts.width, facts.height, facts.pixelFormat]).toEqual([true, 240, 320, "yuv420p"]);
    const all = await plainFfmpeg(rotated);
    const got: Uint8Array[] = [];
    await decodeGrayFrames(testMedia(), {
      input: rotated, videoStreamIndex: 0, pixelFormat: facts.pixelFormat, colorRange: facts.colorRange, first: 1, last: 6, width: facts.width, height: facts.height,
      onFrame: (_, d) => void got.push(d),
    });
    expect(got).toHaveLength(6);
    const size = facts.width * facts.height;
    got.forEach((d, i) => expect(Buffer.from(d).equals(all.subarray(i * size, (i + 1) * size)), `frame ${i + 1}`).toBe(true));
  });

  it("a wrong frame size ends with a message naming the size, a cancel as aborted", async () => {
    await expect(decodeGrayFrames(testMedia(), { input: clip, videoStreamIndex: 0, first: 1, last: 3, width: 150, height: 90, onFrame: () => {} })).rejects.toThrow(/150×90/);
    const abort = new AbortController();
    const run = decodeGrayFrames(testMedia(), { input: clip, videoStreamIndex: 0, first: 1, last: 40, width: 160, height: 90, signal: abort.signal, onFrame: (f) => void (f === 3 && abort.abort()) });
    await expect(run).rejects.toMatchObject({ kind: "aborted" });
    await expect(run).rejects.toBeInstanceOf(FfmpegError);
  });
});

// The analyst marks frame n of the extraction; the job must track that very picture. Interlaced
// video is extracted one picture per field and non-square pixels widened (decision 132, extract.ts).
// Source of truth: the extraction's own frames, the dark box's centre on each.
describe("decodeGrayFrames keeps the extraction's frames", () => {
  const darkCentre = (d: Uint8Array | Buffer, w: number) => {
    let n = 0, sx = 0, sy = 0;
    for (let i = 0; i < d.length; i++) {
      if (d[i] >= 100) continue;
      n++;
      sx += i % w;
      sy += Math.floor(i / w);
    }
    return [sx / n, sy / n];
  };
  const box = "color=white:s=160x96:r=60[bg];color=black:s=8x8:r=60[b];[bg][b]overlay=x='4*n':y='20+2*n':eval=frame";
  it.each([
    { name: "interlaced.mp4", filters: `${box},tinterlace=mode=interleave_top`, codec: ["-flags", "+ildct+ilme", "-x264-params", "tff=1"], frames: 10 },
    { name: "non-square.mp4", filters: `${box},scale=80:96,setsar=2`, codec: [], frames: 12 },
  ])("$name: frame n is the extracted frame n, at the extracted size", async ({ name, filters, codec, frames }) => {
    const file = path.join(dir, name);
    await ffmpeg(["-f", "lavfi", "-i", filters, "-frames:v", String(frames), "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", ...codec, file]);
    const facts = await probe(testMedia(), file);
    expect(facts.interlaced || facts.pixelAspect !== 1, "the source is what the test is about").toBe(true);
    const out = path.join(dir, `${name}-extracted`);
    const extracted = await extractFrames(testMedia(), { input: file, probe: facts, outDir: out, strip: false, quality: 2 });
    expect(extracted.frameCount).toBe(facts.frameCount);
    const got: Uint8Array[] = [];
    const n = await decodeGrayFrames(testMedia(), {
      input: file, videoStreamIndex: facts.videoStreamIndex, first: 1, last: facts.frameCount, width: facts.width, height: facts.height,
      pixelFormat: facts.pixelFormat, colorRange: facts.colorRange, interlaced: facts.interlaced, pixelAspect: facts.pixelAspect,
      onFrame: (_, d) => void got.push(d),
    });
    expect(n).toBe(facts.frameCount);
    for (let f = 1; f <= n; f++) {
      const jpeg = await sharp(path.join(out, "frames", frameFileName(f, "jpg"))).greyscale().raw().toBuffer({ resolveWithObject: true });
      expect([jpeg.info.width, jpeg.info.height]).toEqual([facts.width, facts.height]);
      const [ex, ey] = darkCentre(jpeg.data, jpeg.info.width);
      const [gx, gy] = darkCentre(got[f - 1], facts.width);
      expect(Math.hypot(gx - ex, gy - ey), `frame ${f}: grey (${gx.toFixed(1)}, ${gy.toFixed(1)}), extracted (${ex.toFixed(1)}, ${ey.toFixed(1)})`).toBeLessThan(0.5);
    }
  });
});
