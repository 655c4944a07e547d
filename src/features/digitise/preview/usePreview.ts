import { useEffect, useRef, useState } from "react";
import { toShotDocument, type ShotDocumentParts } from "@shared/schemas/shots";
import type { ShotResults } from "@shared/schemas/shot-results";
import type { PreviewReply } from "./preview-worker";

export type Preview =
  | { state: "idle" }
  | { state: "missing"; message: string }
  | { state: "computing" }
  | { state: "ok"; results: ShotResults; pixelsOnly: boolean; ms: number }
  | { state: "error"; message: string };

/**
 * Results of the working copy, recomputed in a worker a moment after each edit. Without a
 * calibration the engine runs at 1 mm per px, so the numbers read in px (the page says so).
 */
export function usePreview(parts: ShotDocumentParts | null, delayMs = 250): Preview {
  const [preview, setPreview] = useState<Preview>({ state: "idle" });
  const worker = useRef<Worker | null>(null);
  const seq = useRef(0);
  const pixelsOnly = useRef(false);

  useEffect(() => {
    const w = new Worker(new URL("./preview-worker.ts", import.meta.url), { type: "module" });
    w.onmessage = (e: MessageEvent<PreviewReply>) => {
      if (e.data.id !== seq.current) return; // an answer to an older state
      setPreview(e.data.ok ? { state: "ok", results: e.data.results, pixelsOnly: pixelsOnly.current, ms: e.data.ms } : { state: "error", message: e.data.message });
    };
    worker.current = w;
    return () => {
      w.terminate();
      worker.current = null;
    };
  }, []);

  useEffect(() => {
    if (!parts) return;
    const built = toShotDocument(parts, { pixelsOnly: true });
    if (!built.doc) {
      seq.current++; // answers still on their way are for an older state
      setPreview({ state: "missing", message: built.missing.replace("To compute results this shot still needs", "The preview needs") });
      return;
    }
    const t = setTimeout(() => {
      const id = ++seq.current;
      pixelsOnly.current = !parts.calibration;
      setPreview((p) => (p.state === "ok" ? p : { state: "computing" }));
      worker.current?.postMessage({ id, doc: built.doc });
    }, delayMs);
    return () => clearTimeout(t);
  }, [parts, delayMs]);

  return preview;
}
