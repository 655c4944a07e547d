/// <reference lib="webworker" />
// The engine on the client, off the main thread: the live preview while digitising, computed as
// the server stores it (preview-compute.ts).
import { isMechanicsInputError } from "@shared/mechanics/errors";
import type { ShotResults } from "@shared/schemas/shot-results";
import { previewResults } from "./preview-compute";

export interface PreviewRequest {
  id: number;
  doc: unknown;
}
export type PreviewReply = { id: number; ok: true; results: ShotResults; ms: number } | { id: number; ok: false; message: string };

self.onmessage = (e: MessageEvent<PreviewRequest>) => {
  const { id, doc } = e.data;
  const t0 = performance.now();
  try {
    const results = previewResults(doc);
    (self as unknown as Worker).postMessage({ id, ok: true, results, ms: performance.now() - t0 } satisfies PreviewReply);
  } catch (err) {
    const message = isMechanicsInputError(err) ? err.message : `The engine failed: ${(err as Error).message}`;
    (self as unknown as Worker).postMessage({ id, ok: false, message } satisfies PreviewReply);
  }
};
