// The two image operations the tracker needs, done by OpenCV: normalised cross-correlation
// (TM_CCOEFF_NORMED) of a template over a search window, and cutting a turned template.
// Mats are kept between calls and reallocated only when a size changes; dispose() frees them.
import type { GrayFrame } from "./types";
import type { CvMat, OpenCv } from "./opencv";

export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Scores for every top-left placement of the template inside the window, row-major. */
export interface ScoreMap {
  width: number;
  height: number;
  data: Float32Array;
}

export interface Matcher {
  /**
   * `window` must lie inside the frame and be at least as large as the template. With `mask`
   * (the template's size, non-zero = use), only those template pixels count; a placement whose
   * masked pixels are flat scores −1.
   */
  match(frame: GrayFrame, window: Rect, template: GrayFrame, mask?: GrayFrame | null): ScoreMap;
  /**
   * A size × size patch whose centre is (x, y) of `source`, showing the source turned by `angle`
   * (radians, clockwise on screen): what the neighbourhood looks like after the landmark turned.
   */
  turn(source: GrayFrame, x: number, y: number, angle: number, size: number): GrayFrame;
  dispose(): void;
}

export function createCvMatcher(cv: OpenCv): Matcher {
  // One Mat per use and size: the shot tracker's landmarks take turns with windows and templates of
  // their own sizes, and reallocating on every change of size cost as much as a small match.
  const mats = new Map<string, CvMat>();
  const MAX_MATS = 48;
  const sized = (key: string, w: number, h: number): CvMat => {
    const k = `${key} ${w}×${h}`;
    const m = mats.get(k);
    if (m) return m;
    const fresh = new cv.Mat(h, w, cv.CV_8UC1);
    mats.set(k, fresh);
    return fresh;
  };
  /** The last frame patch copied into each Mat (templates and sources are immutable and reused). */
  const holds = new Map<CvMat, GrayFrame>();
  /** At the start of a call (never within one, whose Mats are in use): too many sizes kept, start afresh. */
  const prune = () => {
    if (mats.size < MAX_MATS) return;
    for (const old of mats.values()) old.delete();
    mats.clear();
    holds.clear();
  };
  const copyInto = (mat: CvMat, frame: GrayFrame, r: Rect) => {
    const d = mat.data;
    if (r.width === frame.width && r.height === frame.height) return d.set(frame.data);
    for (let row = 0; row < r.height; row++) {
      const from = (r.y + row) * frame.width + r.x;
      d.set(frame.data.subarray(from, from + r.width), row * r.width);
    }
  };
  const whole = (f: GrayFrame): Rect => ({ x: 0, y: 0, width: f.width, height: f.height });
  const result = new cv.Mat();
  const turned = new cv.Mat();
  const affine = new cv.Mat(2, 3, cv.CV_64FC1);

  return {
    match(frame, window, template, mask) {
      prune();
      const win = sized("window", window.width, window.height);
      copyInto(win, frame, window);
      const tpl = sized("template", template.width, template.height);
      if (holds.get(tpl) !== template) copyInto(tpl, template, whole(template));
      holds.set(tpl, template);
      if (!mask) {
        cv.matchTemplate(win, tpl, result, cv.TM_CCOEFF_NORMED);
        // Copied out: the view dies if the WebAssembly heap grows on a later call.
        return { width: result.cols, height: result.rows, data: result.data32F.slice() };
      }
      const m = sized("mask", mask.width, mask.height);
      if (holds.get(m) !== mask) copyInto(m, mask, whole(mask));
      holds.set(m, mask);
      cv.matchTemplate(win, tpl, result, cv.TM_CCOEFF_NORMED, m);
      const data = result.data32F.slice();
      // A flat masked patch divides by zero: OpenCV then gives NaN or huge values, not a score.
      for (let i = 0; i < data.length; i++) if (!(data[i] <= 1.0001 && data[i] >= -1.0001)) data[i] = -1;
      return { width: result.cols, height: result.rows, data };
    },
    turn(source, x, y, angle, size) {
      prune();
      const src = sized("source", source.width, source.height);
      if (holds.get(src) !== source) copyInto(src, source, whole(source));
      holds.set(src, source);
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      // Inverse map, in OpenCV's pixel-index coordinates (centres on whole numbers): output pixel
      // (i, j) samples the source at (x, y) + R(−angle)·((i, j) + 0.5 − size/2) − 0.5.
      const o = 0.5 - size / 2;
      affine.data64F.set([c, s, x - 0.5 + c * o + s * o, -s, c, y - 0.5 - s * o + c * o]);
      cv.warpAffine(src, turned, affine, new cv.Size(size, size), cv.INTER_LINEAR | cv.WARP_INVERSE_MAP, cv.BORDER_REPLICATE);
      return { width: size, height: size, data: turned.data.slice() };
    },
    dispose() {
      for (const m of mats.values()) m.delete();
      mats.clear();
      holds.clear();
      result.delete();
      turned.delete();
      affine.delete();
    },
  };
}
