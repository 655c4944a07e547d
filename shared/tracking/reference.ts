// What the tracker looks for: the neighbourhood of the landmark on the frame it was last captured
// from. With turning on, a larger patch is kept so that the template can be cut at any angle; a
// mask (which pixels are the landmark's own object) is kept and turned the same way.
import type { Matcher } from "./matcher";
import { rasterMask, type Region } from "./regions";
import { captureTemplate, cropPatch, type Template } from "./template";
import type { GrayFrame } from "./types";

export interface Reference {
  /** The template as captured (cut short at a frame edge). */
  plain: Template;
  /** Patch of side ≥ size·√2 + 2 around the landmark, when it fits inside the frame. */
  source: { patch: GrayFrame; mask: GrayFrame | null; x: number; y: number } | null;
  size: number;
}

export function captureReference(
  frame: GrayFrame,
  x: number,
  y: number,
  size: number,
  minSize: number,
  turning: boolean,
  include?: Region[] | null,
): Reference | null {
  const plain = captureTemplate(frame, x, y, size, minSize, include);
  if (!plain) return null;
  let source: Reference["source"] = null;
  if (turning) {
    const half = Math.ceil((size * Math.SQRT2) / 2) + 2;
    const x0 = Math.floor(x) - half;
    const y0 = Math.floor(y) - half;
    if (x0 >= 0 && y0 >= 0 && x0 + 2 * half <= frame.width && y0 + 2 * half <= frame.height) {
      const mask = include ? rasterMask(2 * half, 2 * half, x0, y0, include) : null;
      source = { patch: cropPatch(frame, { x: x0, y: y0, width: 2 * half, height: 2 * half }), mask, x: x - x0, y: y - y0 };
    }
  }
  return { plain, source, size };
}

/** The template for the landmark turned by `angle` since capture (the plain one when it cannot turn). */
export function templateAt(ref: Reference, angle: number, matcher: Matcher): Template {
  if (!ref.source) return ref.plain;
  const { patch: src, mask: srcMask, x, y } = ref.source;
  const patch = matcher.turn(src, x, y, angle, ref.size);
  let mask: GrayFrame | null = null;
  if (srcMask) {
    // Bilinear turning softens the mask's edge; half way decides.
    mask = matcher.turn(srcMask, x, y, angle, ref.size);
    for (let i = 0; i < mask.data.length; i++) mask.data[i] = mask.data[i] >= 128 ? 255 : 0;
  }
  return { patch, ax: ref.size / 2, ay: ref.size / 2, mask };
}
