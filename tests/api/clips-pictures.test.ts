// Issue 15, pictures: HDR phone video tone-mapped to SDR, BT.709 colour honoured, interlaced
// video as one picture per field, non-square pixels served square, DCI 4K accepted. Every file is
// made here with ffmpeg (x265 10-bit HLG/PQ as phones record; 1080i-style interlaced H.264).
import { ffmpeg, mediaDir, uploadDir } from "./clips-support";
import path from "node:path";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { uploadReady, useCoachWorld } from "./coach-world";

const w = useCoachWorld();


const ready = (file: string) => uploadReady(w, file, path.basename(file));

const frameFile = (clipId: string, n: number) => path.join(uploadDir, "clips", clipId, "frames", `${String(n).padStart(6, "0")}.jpg`);

/** Mean R, G, B of a rectangle of a stored frame. */
async function meanRgb(clipId: string, n: number, box: { left: number; top: number; width: number; height: number }) {
  const { data, info } = await sharp(frameFile(clipId, n)).extract(box).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const sum = [0, 0, 0];
  for (let i = 0; i < data.length; i += info.channels) for (let c = 0; c < 3; c++) sum[c] += data[i + c];
  const px = data.length / info.channels;
  return sum.map((v) => v / px);
}

// A white patch 120 × 80 at (100, 80) on the test pattern, in BT.709 SDR …
const SDR = "testsrc2=s=320x240:r=30,drawbox=x=100:y=80:w=120:h=80:color=white:t=fill,format=yuv420p";
// … taken to linear light and re-encoded with an HDR transfer, as a phone's HDR mode records it
// (SDR white at 100 cd/m² for HLG, at the 203 cd/m² reference white of ITU-R BT.2408 for PQ).
const LINEAR = "zscale=tin=709:min=709:pin=709:rin=limited:t=linear:p=709";
function hdrClip(name: string, transfer: "arib-std-b67" | "smpte2084") {
  const f = path.join(mediaDir, name);
  const npl = transfer === "smpte2084" ? 203 : 100;
  ffmpeg(
    "-f", "lavfi", "-i", SDR, "-frames:v", "10",
    "-vf", `${LINEAR}:npl=${npl},format=gbrpf32le,zscale=p=2020:t=${transfer}:m=2020_ncl:r=limited,format=yuv420p10le`,
    "-c:v", "libx265", "-x265-params", "log-level=error", "-color_primaries", "bt2020", "-color_trc", transfer, "-colorspace", "bt2020nc", f,
  );
  return f;
}

describe("pictures as the camera saw them", () => {
  for (const [label, transfer] of [["HLG", "arib-std-b67"], ["PQ", "smpte2084"]] as const) {
    it(`${label} (BT.2020) is tone-mapped to SDR: the white patch reads ≥ 235 of 255 in frames and strip`, async () => {
      const c = await ready(hdrClip(`phone-${label}.mp4`, transfer));
      const [r, g, b] = await meanRgb(c.id, 1, { left: 120, top: 95, width: 80, height: 50 });
      // Read 244 for both until 4 Dec; with Debian's ffmpeg 5.1.9-0+deb12u1 PQ reads 239.2 (HLG
      // still 244). Without the tone mapping it read 130–161, so 235 still tells the two apart.
      expect(Math.min(r, g, b)).toBeGreaterThanOrEqual(235);
      // The grey background of the pattern is not blown out.
      const dark = await meanRgb(c.id, 1, { left: 4, top: 4, width: 20, height: 20 });
      expect(Math.max(...dark)).toBeLessThan(200);
    });
  }

  it("BT.709 colour: a pure red patch of an HD clip stays pure red in the JPEG frames", async () => {
    const f = path.join(mediaDir, "hd-709.mp4");
    ffmpeg(
      "-f", "lavfi", "-i", "color=c=black:s=1280x720:r=30,drawbox=x=400:y=200:w=400:h=300:color=red:t=fill,format=yuv420p", "-frames:v", "3",
      "-vf", "colorspace=all=bt709:iall=bt601-6-625:fast=1", "-c:v", "libx264", "-preset", "ultrafast", "-colorspace", "bt709", "-color_primaries", "bt709", "-color_trc", "bt709", f,
    );
    const c = await ready(f);
    const [r, g, b] = await meanRgb(c.id, 1, { left: 500, top: 250, width: 200, height: 200 });
    expect(r).toBeGreaterThan(245);
    expect(g).toBeLessThan(8);
    expect(b).toBeLessThan(8);
  });

  it("interlaced video gives one picture per field, twice the frames and twice the rate", async () => {
    const f = path.join(mediaDir, "interlaced.mp4");
    // 50 pictures/s woven into 25 interlaced frames/s, top field first: 40 frames hold 80 fields.
    ffmpeg(
      "-f", "lavfi", "-i", "testsrc2=s=320x240:r=50", "-frames:v", "40", "-vf", "tinterlace=mode=interleave_top,setfield=tff",
      "-c:v", "libx264", "-preset", "ultrafast", "-flags", "+ildct+ilme", "-x264opts", "tff=1", "-field_order", "tt", f,
    );
    const c = await ready(f);
    expect(c.frameCount).toBe(80);
    expect(c.storedFps).toBe(50);
    expect(c.captureFps).toBe(50);
    c.frameTimes.forEach((t: number, i: number) => expect(t).toBeCloseTo(i / 50, 6));
  });

  it("non-square pixels (4:3) are served square: a box drawn 60 stored pixels wide is 80 wide, as tall as it is", async () => {
    const f = path.join(mediaDir, "anamorphic.mp4");
    ffmpeg(
      "-f", "lavfi", "-i", "color=c=black:s=480x270:r=30,drawbox=x=150:y=80:w=60:h=80:color=white:t=fill,format=yuv420p", "-frames:v", "3",
      "-vf", "setsar=4/3", "-c:v", "libx264", "-preset", "ultrafast", f,
    );
    const c = await ready(f);
    expect([c.width, c.height]).toEqual([640, 270]);
    const meta = await sharp(frameFile(c.id, 1)).metadata();
    expect([meta.width, meta.height]).toEqual([640, 270]);
    const { data, info } = await sharp(frameFile(c.id, 1)).greyscale().raw().toBuffer({ resolveWithObject: true });
    const row = 120 * info.width;
    let white = 0;
    for (let x = 0; x < info.width; x++) if (data[row + x] > 128) white++;
    expect(Math.abs(white - 80)).toBeLessThanOrEqual(2);
  });

  it("DCI 4K (4096 × 2160) is accepted by default", async () => {
    const f = path.join(mediaDir, "dci4k.mp4");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=s=4096x2160:r=24", "-frames:v", "2", "-c:v", "libx264", "-preset", "ultrafast", f);
    const c = await ready(f);
    expect([c.width, c.height, c.frameCount]).toEqual([4096, 2160, 2]);
  });
});
