// The frame viewer's transform: screen = pan + zoom · frame, in CSS pixels of the stage. Frame
// coordinates are the clip's original pixels (x right, y down, continuous: pixel (i, j) covers
// [i, i+1) × [j, j+1), so its centre is (i + ½, j + ½)).

export type Vec2 = [number, number];

export interface View {
  zoom: number;
  panX: number;
  panY: number;
}

export const MIN_ZOOM = 0.05;
export const MAX_ZOOM = 32;

export const toFrame = (v: View, s: Vec2): Vec2 => [(s[0] - v.panX) / v.zoom, (s[1] - v.panY) / v.zoom];
export const toScreen = (v: View, f: Vec2): Vec2 => [v.panX + f[0] * v.zoom, v.panY + f[1] * v.zoom];

const clampZoom = (z: number) => Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, z));

/** Zoom by `factor` keeping the frame point under `anchor` (screen) where it is. */
export function zoomAt(v: View, anchor: Vec2, factor: number): View {
  const zoom = clampZoom(v.zoom * factor);
  const [fx, fy] = toFrame(v, anchor);
  return { zoom, panX: anchor[0] - fx * zoom, panY: anchor[1] - fy * zoom };
}

/** Wheel notches to a zoom factor: ~12 % per notch of 100 deltaY, smooth for trackpads. */
export const wheelFactor = (deltaY: number) => Math.exp(-deltaY * 0.00115);

export const panBy = (v: View, dx: number, dy: number): View => ({ ...v, panX: v.panX + dx, panY: v.panY + dy });

/** The whole frame inside the stage, centred, with a margin in screen px. */
export function fitView(stage: { width: number; height: number }, frame: { width: number; height: number }, margin = 12): View {
  const zoom = clampZoom(Math.min((stage.width - 2 * margin) / frame.width, (stage.height - 2 * margin) / frame.height));
  return { zoom, panX: (stage.width - frame.width * zoom) / 2, panY: (stage.height - frame.height * zoom) / 2 };
}

/** Original pixels (one frame pixel to one screen pixel), centred on the stage centre's frame point. */
export function actualPixels(v: View, stage: { width: number; height: number }): View {
  return zoomAt(v, [stage.width / 2, stage.height / 2], 1 / v.zoom);
}

export function insideFrame(p: Vec2, frame: { width: number; height: number }): boolean {
  return p[0] >= 0 && p[1] >= 0 && p[0] <= frame.width && p[1] <= frame.height;
}

export const dist = (a: Vec2, b: Vec2) => Math.hypot(a[0] - b[0], a[1] - b[1]);
