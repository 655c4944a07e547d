import { useEffect, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { env } from "@/lib/env";
import type { ClipProgress } from "@shared/schemas/clips";
import { clipChanged, clipPath } from "@/entities/clip";

/**
 * GET /api/teams/:teamId/clips/:clipId/progress as Server-Sent Events while `live`: each event
 * updates the bar; the end (ready, failed) refreshes the clip and the list. Merge it with the stored
 * clip through `extractionView` (the stored clip may learn the end first).
 */
export function useClipProgress(teamId: string, clipId: string, live: boolean): ClipProgress | null {
  const qc = useQueryClient();
  const [progress, setProgress] = useState<ClipProgress | null>(null);
  useEffect(() => {
    if (!live) return;
    const source = new EventSource(`${env.apiBase}${clipPath(teamId, clipId)}/progress`);
    const refresh = () => {
      void clipChanged(qc, teamId);
    };
    source.addEventListener("progress", (e) => {
      const p = JSON.parse((e as MessageEvent<string>).data) as ClipProgress;
      setProgress(p);
      if (p.status === "ready" || p.status === "failed") {
        source.close();
        refresh();
      }
    });
    source.addEventListener("gone", () => {
      source.close();
      refresh();
    });
    return () => {
      source.close();
      // A later run (a retry) starts from the stored clip, not from this run's last event.
      setProgress(null);
    };
  }, [teamId, clipId, live, qc]);
  return progress;
}
