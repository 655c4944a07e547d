import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "@/lib/api";
import type { ClipDetail, ClipPatch } from "@shared/schemas/clips";
import { clipKey, clipOptionsKey, clipPath, clipsKey } from "./keys";

/** PATCH /api/teams/:teamId/clips/:clipId — edit details or confirm the capture rate. 422 names the field. */
export const updateClip = (teamId: string, clipId: string, body: ClipPatch) => apiPatch<ClipDetail>(clipPath(teamId, clipId), body);

export function useUpdateClip(teamId: string, clipId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ClipPatch) => updateClip(teamId, clipId, body),
    meta: { toast: false }, // the form shows the message next to its field
    onSuccess: (clip, body) => {
      qc.setQueryData(clipKey(teamId, clipId), clip);
      void qc.invalidateQueries({ queryKey: clipsKey(teamId) });
      if (body.newSession) void qc.invalidateQueries({ queryKey: clipOptionsKey(teamId) });
      // A new player (with or without the shots) changes who sees the clip and its shots everywhere.
      if (body.playerId) void qc.invalidateQueries({ queryKey: ["teams", teamId] });
    },
  });
}
