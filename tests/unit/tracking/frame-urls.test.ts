// Frame URLs and the gray conversion of the worker's frame source.
// Sources: ffmpeg's own RGBA → gray conversion (libswscale, BT.601 full-range luma) for rgbaToGray;
// the protocol's URL rules are ours.
import { execa } from "execa";
import { describe, expect, it } from "vitest";
import { rgbaToGray, urlFrameSource } from "../../../src/features/digitise/tracking/gray-frames";
import { frameRange, frameUrl } from "../../../src/features/digitise/tracking/protocol";

describe("frame URLs", () => {
  it("fills {frame} and zero-pads {frame:N}", () => {
    expect(frameUrl({ urlTemplate: "/c/frames/{frame}", first: 1, last: 9 }, 7)).toBe("/c/frames/7");
    expect(frameUrl({ urlTemplate: "/c/{frame:6}.jpg", first: 1, last: 9 }, 42)).toBe("/c/000042.jpg");
    expect(frameUrl({ urls: ["a", "b", "c"], first: 10 }, 11)).toBe("b");
    expect(frameRange({ urls: ["a", "b", "c"], first: 10 })).toEqual({ first: 10, last: 12 });
  });

  it("fetches each frame and names the one that failed", async () => {
    const asked: string[] = [];
    const gray = { width: 1, height: 1, data: new Uint8Array([9]) };
    const source = urlFrameSource(3, (i) => `/f/${i + 1}`, {
      fetch: (async (url: string) => {
        asked.push(url);
        return new Response(url === "/f/3" ? null : new Blob(["x"]), { status: url === "/f/3" ? 404 : 200 });
      }) as typeof fetch,
      decode: async () => gray,
    });
    expect(await source.frame(0)).toBe(gray);
    await expect(source.frame(2)).rejects.toThrow("frame image /f/3 answered 404");
    expect(asked).toEqual(["/f/1", "/f/3"]);
  });
});

describe("rgbaToGray", () => {
  it("matches ffmpeg's RGBA → gray conversion within one level", async () => {
    const [w, h] = [160, 120];
    const run = (pix: string) =>
      execa("ffmpeg", ["-nostdin", "-v", "error", "-f", "lavfi", "-i", `testsrc2=s=${w}x${h}:r=1`, "-frames:v", "1", "-f", "rawvideo", "-pix_fmt", pix, "pipe:1"], { encoding: "buffer" });
    const rgba = (await run("rgba")).stdout;
    const viaRgba = await execa("ffmpeg", ["-nostdin", "-v", "error", "-f", "rawvideo", "-pix_fmt", "rgba", "-s", `${w}x${h}`, "-i", "pipe:0", "-f", "rawvideo", "-pix_fmt", "gray", "pipe:1"], {
      input: rgba,
      encoding: "buffer",
    });
    const mine = rgbaToGray(new Uint8Array(rgba), w, h);
    let worst = 0;
    for (let i = 0; i < w * h; i++) worst = Math.max(worst, Math.abs(mine.data[i] - viaRgba.stdout[i]));
    expect(worst).toBeLessThanOrEqual(1);
  });

  it("rejects a buffer of the wrong size", () => {
    expect(() => rgbaToGray(new Uint8Array(10), 2, 2)).toThrow("expected 16 RGBA bytes for 2×2, got 10");
  });
});
