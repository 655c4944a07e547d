import type { LoaderReply } from "./frame-loader.worker";

/**
 * A frame loader backed by one worker: fetch, decode and transfer happen off the main thread, so
 * stepping keeps the main thread for drawing. Falls back to loading here when workers are missing.
 */
export function createFrameLoader(): { load(url: string, signal: AbortSignal): Promise<ImageBitmap>; dispose(): void } {
  if (typeof Worker === "undefined") return { load: loadFrameBitmap, dispose: () => {} };
  const w = new Worker(new URL("./frame-loader.worker.ts", import.meta.url), { type: "module" });
  const pending = new Map<number, { resolve(b: ImageBitmap): void; reject(e: Error): void }>();
  let next = 1;
  w.onmessage = (e: MessageEvent<LoaderReply>) => {
    const p = pending.get(e.data.id);
    if (!p) {
      if ("bitmap" in e.data) e.data.bitmap.close();
      return;
    }
    pending.delete(e.data.id);
    if ("bitmap" in e.data) p.resolve(e.data.bitmap);
    else p.reject(new Error(e.data.error));
  };
  return {
    load(url, signal) {
      const id = next++;
      return new Promise<ImageBitmap>((resolve, reject) => {
        pending.set(id, { resolve, reject });
        signal.addEventListener("abort", () => {
          pending.delete(id);
          w.postMessage({ type: "abort", id });
          reject(new DOMException("aborted", "AbortError"));
        });
        w.postMessage({ type: "load", id, url: new URL(url, location.href).href });
      });
    },
    dispose: () => w.terminate(),
  };
}

/** Fetch and decode one frame here; aborts with the signal. */
export async function loadFrameBitmap(url: string, signal: AbortSignal): Promise<ImageBitmap> {
  const res = await fetch(url, { signal, credentials: "same-origin" });
  if (!res.ok) throw new Error(`frame ${url} answered ${res.status}`);
  const bitmap = await createImageBitmap(await res.blob());
  if (signal.aborted) {
    bitmap.close();
    throw new DOMException("aborted", "AbortError");
  }
  return bitmap;
}
