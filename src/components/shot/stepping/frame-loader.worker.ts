/// <reference lib="webworker" />
// Fetches and decodes frames off the main thread; the decoded bitmap is transferred, not copied.
export type LoaderRequest = { type: "load"; id: number; url: string } | { type: "abort"; id: number };
export type LoaderReply = { id: number; bitmap: ImageBitmap } | { id: number; error: string };

const inflight = new Map<number, AbortController>();
self.onmessage = async (e: MessageEvent<LoaderRequest>) => {
  const m = e.data;
  if (m.type === "abort") {
    inflight.get(m.id)?.abort();
    return;
  }
  const c = new AbortController();
  inflight.set(m.id, c);
  try {
    const res = await fetch(m.url, { signal: c.signal, credentials: "same-origin" });
    if (!res.ok) throw new Error(`frame answered ${res.status}`);
    const bitmap = await createImageBitmap(await res.blob());
    if (c.signal.aborted) {
      bitmap.close();
      throw new Error("aborted");
    }
    (self as unknown as Worker).postMessage({ id: m.id, bitmap } satisfies LoaderReply, [bitmap]);
  } catch (err) {
    (self as unknown as Worker).postMessage({ id: m.id, error: (err as Error).message } satisfies LoaderReply);
  } finally {
    inflight.delete(m.id);
  }
};
