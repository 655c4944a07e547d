// The one place that loads @techstark/opencv-js. Two traps shape it:
// - Its module object is a thenable whose `then` hands back the module itself, so awaiting it (or
//   resolving a promise with it, or awaiting an import namespace that copies its keys, as test
//   runners' CommonJS interop does) loops forever. It is only ever wrapped in a plain object.
// - Loading it in Node installs process-wide handlers: one rethrows every uncaught exception, one
//   aborts the WebAssembly runtime on any unhandled rejection. They are removed right after.
// In Node it is required directly; a browser bundle (the tracking worker) hands over its own static
// import with provideOpenCv, which never awaits the module.

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
  matchTemplate(image: CvMat, templ: CvMat, result: CvMat, method: number, mask?: CvMat): void;
  warpAffine(src: CvMat, dst: CvMat, m: CvMat, size: unknown, flags: number, borderMode: number): void;
}

type Thenable = { then(cb: (m: OpenCv) => void): unknown };

let provided: unknown;
let ready: Promise<{ cv: OpenCv }> | undefined;

/** For bundles: `import cv from "@techstark/opencv-js"; provideOpenCv(cv)` before the first track. */
export function provideOpenCv(module: unknown): void {
  provided = module;
}

/** Resolves once the WebAssembly runtime is initialised (~0.3 s the first time, then cached). */
export function loadOpenCv(): Promise<{ cv: OpenCv }> {
  ready ??= new Promise((resolve, reject) => {
    try {
      const mod = (provided ?? requireInNode()) as Thenable;
      mod.then((m) => resolve({ cv: m }));
    } catch (e) {
      reject(e);
    }
  });
  return ready;
}

type NodeProcess = {
  getBuiltinModule?(id: string): unknown;
  listeners(event: string): ((...a: unknown[]) => void)[];
  removeListener(event: string, fn: (...a: unknown[]) => void): unknown;
};

function requireInNode(): unknown {
  const proc = (globalThis as { process?: NodeProcess }).process;
  const nodeModule = proc?.getBuiltinModule?.("node:module") as { createRequire(from: string): (id: string) => unknown } | undefined;
  if (!proc || !nodeModule) throw new Error("OpenCV is not loaded: a browser bundle must call provideOpenCv(module) first");
  const events = ["uncaughtException", "unhandledRejection"];
  const before = new Map(events.map((e) => [e, new Set(proc.listeners(e))]));
  try {
    return nodeModule.createRequire(import.meta.url)("@techstark/opencv-js");
  } finally {
    for (const e of events) for (const fn of proc.listeners(e)) if (!before.get(e)!.has(fn)) proc.removeListener(e, fn);
  }
}
