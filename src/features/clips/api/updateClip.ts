import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "@/lib/api";
import type { ClipDetail, ClipPatch } from "@shared/schemas/clips";
import { clipChanged, clipKeys, clipPath } from "@/entities/clip";

/** PATCH /api/teams/:teamId/clips/:clipId — edit details or confirm the capture rate. 422 names the field. */
export const updateClip = (teamId: string, clipId: string, body: ClipPatch) => apiPatch<ClipDetail>(clipPath(teamId, clipId), body);

export function useUpdateClip(teamId: string, clipId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ClipPatch) => updateClip(teamId, clipId, body),
    meta: { toast: false }, // the form shows the message next to its field
    onSuccess: (clip, body) => {
      qc.setQueryData(clipKeys.one(teamId, clipId), clip);
      // The clip's player and session are its shots' too: every view of shots refreshes. A new
      // player (with or without the shots) changes who sees the clip and its shots everywhere.
      void clipChanged(qc, teamId, { options: !!body.newSession, access: !!body.playerId });
    },
  });
}
