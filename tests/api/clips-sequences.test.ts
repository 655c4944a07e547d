// Image sequences (decision 134): numbered frames as lab cameras export them, made here with
// ffmpeg (8-bit PNG, 16-bit grey TIFF, JPEG), zipped in the test and uploaded through tus →
// check → probe → extraction: frame count, times from the typed rate, and the refusals, each
// naming the file at fault and leaving nothing stored.
import { ffmpeg, mediaDir, storedClipDirs, tusLeftovers, tusUpload, uploadDir } from "./clips-support";
import { execFileSync } from "node:child_process";
import { crc32 } from "node:zlib";
import { existsSync, mkdirSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { zipSync, type Zippable } from "fflate";
import { describe, expect, it } from "vitest";
import { clipUpload, uploadReady, useCoachWorld } from "./coach-world";
import { captureTimes } from "../../shared/schemas/clips";

const w = useCoachWorld();

const md = (filename: string, over: Record<string, unknown> = {}) => clipUpload(w, filename, over);

/** Numbered frames of the test pattern, written by ffmpeg's image2 muxer; answers name → bytes. */
function frames(name: string, o: { count: number; ext: string; size?: string; pixFmt?: string; start?: number; prefix?: string }): Record<string, Uint8Array> {
  const dir = path.join(mediaDir, name);
  mkdirSync(dir, { recursive: true });
  ffmpeg(
    "-f", "lavfi", "-i", `testsrc2=size=${o.size ?? "320x240"}:rate=25`, "-frames:v", String(o.count),
    ...(o.pixFmt ? ["-pix_fmt", o.pixFmt] : []),
    "-start_number", String(o.start ?? 1),
    path.join(dir, `${o.prefix ?? "run12_"}%06d.${o.ext}`),
  );
  return Object.fromEntries(readdirSync(dir).sort().map((f) => [f, new Uint8Array(readFileSync(path.join(dir, f)))]));
}

/** A ZIP as a lab export: images stored (level 0), as cameras' own tools write them. */
const zip = (entries: Zippable) => Buffer.from(zipSync(entries, { level: 0 }));

async function upload(data: Buffer, filename: string, over: Record<string, unknown> = {}) {
  return tusUpload(w.srv.url, w.coach, data, md(filename, over));
}

const ready = (data: Buffer, filename: string, captureFps: number) => uploadReady(w, data, filename, { captureFps, captureFpsConfirmed: true });

const storedFrames = (clipId: string) => readdirSync(path.join(uploadDir, "clips", clipId, "frames")).sort();
const grey = (file: string) =>
  execFileSync("ffmpeg", ["-v", "error", "-i", file, "-vf", "scale=1:1:flags=area,format=gray", "-f", "rawvideo", "-"])[0];

describe("image sequences through the upload path", () => {
  it("8-bit PNG in a folder, with a camera's settings file beside it: every frame, times from the typed rate", async () => {
    const pngs = frames("png8", { count: 30, ext: "png", pixFmt: "rgb24" });
    const entries: Zippable = { "cam1/": {}, "cam1/settings.xml": new TextEncoder().encode("<camera/>"), "__MACOSX/cam1/._run12_000001.png": new Uint8Array(8) };
    for (const [n, b] of Object.entries(pngs)) entries[`cam1/${n}`] = b;
    const c = await ready(zip(entries), "run12.zip", 2000);
    expect(c.frameCount).toBe(30);
    expect(storedFrames(c.id)).toHaveLength(30);
    expect([c.width, c.height]).toEqual([320, 240]);
    expect(c.captureFps).toBe(2000);
    expect(c.captureFpsConfirmed).toBe(true);
    expect(c.timing).toMatchObject({ gapCount: 0, repeatCount: 0, missingTail: null });
    const t = captureTimes(c.frameTimes, c.storedFps, c.captureFps);
    t.forEach((s, i) => expect(s).toBeCloseTo(i / 2000, 9));
    expect(c.durationS).toBeCloseTo(30 / 2000, 9);
    expect(c.title).toBe("run12");
  });

  it("16-bit grey TIFF at 5,000 fps: frames in order, picture kept", async () => {
    const tifs = frames("tif16", { count: 20, ext: "tif", pixFmt: "gray16le", start: 0 });
    const c = await ready(zip(tifs), "grey16.zip", 5000);
    expect(c.frameCount).toBe(20);
    const stored = storedFrames(c.id);
    expect(stored).toHaveLength(20);
    const t = captureTimes(c.frameTimes, c.storedFps, c.captureFps);
    expect(t[19]).toBeCloseTo(19 / 5000, 9);
    // The same picture as the source frame, within JPEG's rounding (frame 11 = source index 10).
    const src = path.join(mediaDir, "tif16", "run12_000010.tif");
    expect(Math.abs(grey(path.join(uploadDir, "clips", c.id, "frames", stored[10])) - grey(src))).toBeLessThanOrEqual(3);
  });

  it("12-bit data in 16-bit grey PNGs (sBIT 12): the frames get the full levels, not the dark high byte", async () => {
    // The camera's 12-bit samples (0–4095) in 16-bit PNGs, each declaring 12 significant bits in an
    // sBIT chunk right after IHDR (PNG specification, 11.3.3.4).
    const dir = path.join(mediaDir, "png12");
    mkdirSync(dir, { recursive: true });
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=320x240:rate=25", "-frames:v", "10", "-vf", "format=gray16le,lut=c0=val/16", path.join(dir, "shot_%04d.png"));
    const sbit = Buffer.alloc(13);
    sbit.writeUInt32BE(1, 0);
    sbit.write("sBIT", 4, "latin1");
    sbit[8] = 12;
    sbit.writeUInt32BE(crc32(sbit.subarray(4, 9)), 9);
    const entries: Zippable = {};
    for (const f of readdirSync(dir).sort()) {
      const png = readFileSync(path.join(dir, f));
      entries[f] = new Uint8Array(Buffer.concat([png.subarray(0, 33), sbit, png.subarray(33)])); // 8 signature + 25 IHDR
    }
    const full = frames("png16full", { count: 10, ext: "png", pixFmt: "gray16le" });
    const c = await ready(zip(entries), "twelve-bit.zip", 4000);
    expect(c.frameCount).toBe(10);
    const stored = storedFrames(c.id);
    // As bright as the same picture at full 16 bits, within JPEG's rounding; the high byte alone would be 1/16 of it.
    const reference = grey(path.join(mediaDir, "png16full", Object.keys(full)[4]));
    expect(reference).toBeGreaterThan(60);
    expect(Math.abs(grey(path.join(uploadDir, "clips", c.id, "frames", stored[4])) - reference)).toBeLessThanOrEqual(3);
  });

  it("JPEG frames (.jpeg and .JPG alike), numbered without padding", async () => {
    const jpgs = frames("jpg", { count: 12, ext: "jpg", prefix: "f" });
    const entries: Zippable = {};
    // Unpadded numbers sort by value, not by text (f10 after f9).
    for (const [n, b] of Object.entries(jpgs)) entries[n.replace(/f0+(\d)/, "f$1").replace(/\.jpg$/, Number(n.match(/\d+/)![0]) % 2 ? ".JPG" : ".jpeg")] = b;
    const c = await ready(zip(entries), "jpeg-run.zip", 1000);
    expect(c.frameCount).toBe(12);
    expect(storedFrames(c.id)).toHaveLength(12);
    expect(captureTimes(c.frameTimes, c.storedFps, c.captureFps)[11]).toBeCloseTo(0.011, 9);
  });
});

describe("refused sequences name the file and store nothing", () => {
  const before = () => ({ clips: storedClipDirs().length, tus: tusLeftovers().length, jobs: existsSync(path.join(uploadDir, ".jobs")) ? readdirSync(path.join(uploadDir, ".jobs")).length : 0 });

  async function refused(data: Buffer, filename: string, over: Record<string, unknown> = { captureFps: 1000, captureFpsConfirmed: true }) {
    const b = before();
    const r = await upload(data, filename, over);
    expect(r.ok).toBe(false);
    expect(r.status).toBe(422);
    expect(before()).toEqual(b);
    return r.body as { code: string; detail: string; file?: string };
  }

  it("no capture rate typed: refused when the upload starts, before any byte", async () => {
    const body = await refused(zip(frames("norate", { count: 3, ext: "png" })), "norate.zip", {});
    expect(body.code).toBe("sequence_rate_missing");
    expect(body.detail).toMatch(/rate the camera recorded at/);
  });

  it("no capture rate, ZIP under another name: refused at the end all the same", async () => {
    const body = await refused(zip(frames("norate2", { count: 3, ext: "png" })), "frames.bin", {});
    expect(body.code).toBe("sequence_rate_missing");
  });

  it("a gap in the numbering", async () => {
    const f = frames("gap", { count: 8, ext: "png" });
    delete f["run12_000004.png"];
    delete f["run12_000005.png"];
    const body = await refused(zip(f), "gap.zip");
    expect(body.code).toBe("sequence_gap");
    expect(body.detail).toContain("run12_000003.png is followed by run12_000006.png");
    expect(body.detail).toContain("frames 4–5 are missing");
  });

  it("mixed sizes", async () => {
    const f = frames("mixed", { count: 6, ext: "png" });
    f["run12_000004.png"] = frames("mixed-big", { count: 1, ext: "png", size: "640x480", start: 4 })["run12_000004.png"];
    const body = await refused(zip(f), "mixed.zip");
    expect(body.code).toBe("sequence_mixed_sizes");
    expect(body.detail).toContain("run12_000004.png is 640 × 480 pixels, but the frames before it are 320 × 240");
  });

  it("an unreadable image (cut short) and one that is not an image at all", async () => {
    const f = frames("broken", { count: 6, ext: "png" });
    f["run12_000005.png"] = f["run12_000005.png"].subarray(0, 2000);
    expect((await refused(zip(f), "cut.zip")).detail).toMatch(/^run12_000005\.png cannot be read as an image/);
    const g = frames("garbage", { count: 6, ext: "tif" });
    g["run12_000002.tif"] = new TextEncoder().encode("not a tiff at all, just words");
    const body = await refused(zip(g), "garbage.zip");
    expect(body.code).toBe("sequence_unreadable_image");
    expect(body.detail).toMatch(/^run12_000002\.tif cannot be read/);
  });

  it("hostile archives: a name climbing out, a link", async () => {
    const f = frames("hostile", { count: 3, ext: "png" });
    const climb = await refused(zip({ ...f, "../../evil.png": f["run12_000001.png"] }), "climb.zip");
    expect(climb.code).toBe("sequence_unsafe_archive");
    expect(climb.detail).toContain("../../evil.png");
    expect(existsSync(path.join(uploadDir, "..", "evil.png"))).toBe(false);
    // A Unix symlink entry (mode 0120777 in the upper half of the external attributes).
    const link = await refused(zip({ ...f, "run12_000004.png": [new TextEncoder().encode("/etc/passwd"), { os: 3, attrs: (0o120777 << 16) >>> 0 }] }), "link.zip");
    expect(link.code).toBe("sequence_unsafe_archive");
    expect(link.detail).toContain("run12_000004.png is a link");
  });
});
