/// <reference lib="webworker" />
// The engine on the client, off the main thread: the live preview while digitising. Fewer
// Monte Carlo trials than the server (the stored result is the authoritative one).
import { computeShot } from "@shared/mechanics/compute-shot";
import { isMechanicsInputError } from "@shared/mechanics/errors";

export interface PreviewRequest {
  id: number;
  doc: unknown;
}
export type PreviewReply = { id: number; ok: true; results: ReturnType<typeof computeShot>; ms: number } | { id: number; ok: false; message: string };

const PREVIEW_TRIALS = 60;

self.onmessage = (e: MessageEvent<PreviewRequest>) => {
  const { id, doc } = e.data;
  const t0 = performance.now();
  try {
    const results = computeShot(doc, { trials: PREVIEW_TRIALS });
    (self as unknown as Worker).postMessage({ id, ok: true, results, ms: performance.now() - t0 } satisfies PreviewReply);
  } catch (err) {
    const message = isMechanicsInputError(err) ? err.message : `The engine failed: ${(err as Error).message}`;
    (self as unknown as Worker).postMessage({ id, ok: false, message } satisfies PreviewReply);
  }
};
