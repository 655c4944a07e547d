import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import type { ClipDetail } from "@shared/schemas/clips";
import { clipChanged, clipPath } from "@/entities/clip";

/** POST /api/teams/:teamId/clips/:clipId/retry — extract a failed clip again. 409 not_failed. */
export const retryClip = (teamId: string, clipId: string) => apiPost<ClipDetail>(`${clipPath(teamId, clipId)}/retry`);

export function useRetryClip(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (clipId: string) => retryClip(teamId, clipId),
    onSuccess: () => clipChanged(qc, teamId),
  });
}
