// The one place that loads @techstark/opencv-js. Its module object is a thenable whose `then`
// hands back the module itself, so awaiting it (or resolving a promise with it) loops forever:
// it is always wrapped in a plain object.
import { removeHandlersAddedSinceSnapshot } from "./node-listeners";
import cvModule from "@techstark/opencv-js";

removeHandlersAddedSinceSnapshot();

/** The few OpenCV members the tracker uses (the package's own types are large and loose). */
export interface CvMat {
  readonly rows: number;
  readonly cols: number;
  readonly data: Uint8Array;
  readonly data32F: Float32Array;
  readonly data64F: Float64Array;
  delete(): void;
}

export interface OpenCv {
  Mat: new (rows?: number, cols?: number, type?: number) => CvMat;
  Size: new (width: number, height: number) => unknown;
  CV_8UC1: number;
  CV_64FC1: number;
  TM_CCOEFF_NORMED: number;
  INTER_LINEAR: number;
  WARP_INVERSE_MAP: number;
  BORDER_REPLICATE: number;
  matchTemplate(image: CvMat, templ: CvMat, result: CvMat, method: number): void;
  warpAffine(src: CvMat, dst: CvMat, m: CvMat, size: unknown, flags: number, borderMode: number): void;
}

let ready: Promise<{ cv: OpenCv }> | undefined;

/** Resolves once the WebAssembly runtime is initialised (~0.3 s the first time, then cached). */
export function loadOpenCv(): Promise<{ cv: OpenCv }> {
  ready ??= new Promise((resolve) => {
    (cvModule as unknown as { then(cb: (m: OpenCv) => void): unknown }).then((m) => resolve({ cv: m }));
  });
  return ready;
}
