// Templates are square patches cut around a landmark; near a frame edge they are cut short, and
// the landmark's place inside the patch (the anchor) is kept to sub-pixel precision.
import type { GrayFrame } from "./types";
import type { Rect } from "./matcher";
import { rasterMask, type Region } from "./regions";

export interface Template {
  patch: GrayFrame;
  /** Landmark position relative to the patch's top-left corner. */
  ax: number;
  ay: number;
  /** Which pixels belong to the landmark's object (non-zero); absent: all of them. */
  mask?: GrayFrame | null;
}

/** Where to search and with which (possibly cropped) template. */
export interface SearchPlan {
  window: Rect;
  template: GrayFrame;
  /** The template's mask, cropped the same way. */
  mask: GrayFrame | null;
  /** Landmark = (window.x + u + ax, window.y + v + ay) for the template placed at map cell (u, v). */
  ax: number;
  ay: number;
}

export function cropPatch(frame: GrayFrame, r: Rect): GrayFrame {
  const data = new Uint8Array(r.width * r.height);
  for (let row = 0; row < r.height; row++) {
    const from = (r.y + row) * frame.width + r.x;
    data.set(frame.data.subarray(from, from + r.width), row * r.width);
  }
  return { width: r.width, height: r.height, data };
}

/**
 * A size × size patch centred on (x, y), cut short at the frame edges; null if under minSize
 * remains. With `include`, its mask keeps the pixels inside those regions.
 */
export function captureTemplate(frame: GrayFrame, x: number, y: number, size: number, minSize: number, include?: Region[] | null): Template | null {
  const x0 = Math.max(0, Math.round(x - size / 2));
  const y0 = Math.max(0, Math.round(y - size / 2));
  const x1 = Math.min(frame.width, Math.round(x - size / 2) + size);
  const y1 = Math.min(frame.height, Math.round(y - size / 2) + size);
  if (x1 - x0 < minSize || y1 - y0 < minSize) return null;
  const patch = cropPatch(frame, { x: x0, y: y0, width: x1 - x0, height: y1 - y0 });
  const mask = include ? rasterMask(patch.width, patch.height, x0, y0, include) : null;
  return { patch, ax: x - x0, ay: y - y0, mask };
}

interface AxisPlan {
  start: number;
  length: number;
  cropStart: number;
  cropLength: number;
  anchor: number;
}

/**
 * One axis of the search: template placements from floor(q − r) to ceil(q + r), q being the
 * predicted top-left. The template is cropped by what would leave the frame at the predicted
 * placement (or, with `reach`, at the farthest placements, to follow a landmark right up to the
 * edge); the placements are then limited to those that keep the cropped template inside.
 */
function planAxis(frameLength: number, tplLength: number, anchor: number, predicted: number, radius: number, minSize: number, reach: boolean): AxisPlan | null {
  if (!(predicted >= 0 && predicted < frameLength)) return null;
  const q = predicted - anchor;
  const qr = Math.round(q);
  const cropStart = Math.max(0, -(reach ? Math.floor(q - radius) : qr));
  const cropEnd = Math.max(0, (reach ? Math.ceil(q + radius) : qr) + tplLength - frameLength);
  const cropLength = tplLength - cropStart - cropEnd;
  const a = anchor - cropStart;
  if (cropLength < minSize || a < 0 || a > cropLength) return null;
  const first = Math.max(Math.min(qr, Math.floor(q - radius)), -cropStart);
  const last = Math.min(Math.max(qr, Math.ceil(q + radius)), frameLength - tplLength + cropEnd);
  return { start: first + cropStart, length: last - first + cropLength, cropStart, cropLength, anchor: a };
}

/** Null when the landmark would be outside the frame or too little of the template would remain. */
export function planSearch(
  frame: { width: number; height: number },
  tpl: Template,
  predicted: { x: number; y: number },
  radius: number,
  minSize: number,
  reach = false,
): SearchPlan | null {
  const px = planAxis(frame.width, tpl.patch.width, tpl.ax, predicted.x, radius, minSize, reach);
  const py = planAxis(frame.height, tpl.patch.height, tpl.ay, predicted.y, radius, minSize, reach);
  if (!px || !py) return null;
  const cropped = px.cropLength !== tpl.patch.width || py.cropLength !== tpl.patch.height;
  const crop = { x: px.cropStart, y: py.cropStart, width: px.cropLength, height: py.cropLength };
  const template = cropped ? cropPatch(tpl.patch, crop) : tpl.patch;
  const mask = tpl.mask ? (cropped ? cropPatch(tpl.mask, crop) : tpl.mask) : null;
  return { window: { x: px.start, y: py.start, width: px.length, height: py.length }, template, mask, ax: px.anchor, ay: py.anchor };
}
