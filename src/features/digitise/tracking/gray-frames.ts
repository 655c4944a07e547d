// Frames for the tracker inside a worker: fetch a frame image, decode it with createImageBitmap
// (off the thread in the browser), read its pixels through an OffscreenCanvas, keep one gray byte
// per pixel.
import type { FrameSource, GrayFrame } from "@shared/tracking/types";

/** Luma with the ITU-R BT.601 weights (0.299, 0.587, 0.114) in 8.8 fixed point, as JPEG's Y. */
export function rgbaToGray(rgba: Uint8ClampedArray | Uint8Array, width: number, height: number): GrayFrame {
  const n = width * height;
  if (rgba.length !== n * 4) throw new Error(`expected ${n * 4} RGBA bytes for ${width}×${height}, got ${rgba.length}`);
  const data = new Uint8Array(n);
  for (let i = 0, j = 0; i < n; i++, j += 4) data[i] = (77 * rgba[j] + 150 * rgba[j + 1] + 29 * rgba[j + 2] + 128) >> 8;
  return { width, height, data };
}

let canvas: OffscreenCanvas | undefined;
let ctx: OffscreenCanvasRenderingContext2D | null = null;

/** Decodes an image blob to gray pixels (browser or worker: createImageBitmap + one reused OffscreenCanvas). */
export async function decodeGray(blob: Blob): Promise<GrayFrame> {
  const bitmap = await createImageBitmap(blob, { colorSpaceConversion: "none", premultiplyAlpha: "none" });
  try {
    if (!canvas || canvas.width !== bitmap.width || canvas.height !== bitmap.height) {
      canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
      ctx = canvas.getContext("2d", { willReadFrequently: true });
    }
    if (!ctx) throw new Error("no 2D canvas context in this worker");
    ctx.drawImage(bitmap, 0, 0);
    return rgbaToGray(ctx.getImageData(0, 0, bitmap.width, bitmap.height).data, bitmap.width, bitmap.height);
  } finally {
    bitmap.close();
  }
}

export interface UrlFrameOptions {
  fetch?: typeof fetch;
  decode?: (blob: Blob) => Promise<GrayFrame>;
  /** Frames fetched and decoded ahead, in parallel (default 2; more can pay on a machine with many cores). */
  prefetch?: number;
}

/** Frame i is the image at url(i); a failed answer names the frame and the status. */
export function urlFrameSource(length: number, url: (index: number) => string, o: UrlFrameOptions = {}): FrameSource {
  const get = o.fetch ?? fetch;
  const decode = o.decode ?? decodeGray;
  return {
    length,
    prefetch: o.prefetch ?? 2,
    async frame(index, signal) {
      const res = await get(url(index), { signal, credentials: "same-origin" });
      if (!res.ok) throw new Error(`frame image ${url(index)} answered ${res.status}`);
      return decode(await res.blob());
    },
  };
}
