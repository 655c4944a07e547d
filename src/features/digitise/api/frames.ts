import { env } from "@/lib/env";

/** A frame image of a clip (served by clip ingest, cached as immutable). Frames count from 1. */
export const frameUrl = (teamId: string, clipId: string, n: number) =>
  `${env.apiBase}/teams/${encodeURIComponent(teamId)}/clips/${encodeURIComponent(clipId)}/frames/${n}`;

/** Fetch and decode one frame off the main thread; aborts with the signal. */
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
