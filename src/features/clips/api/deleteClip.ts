import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { clipChanged, clipPath } from "@/entities/clip";

/** DELETE /api/teams/:teamId/clips/:clipId — removes the clip, its frames, files and shots. */
export const deleteClip = (teamId: string, clipId: string) => apiDelete(clipPath(teamId, clipId));

export function useDeleteClip(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (clipId: string) => deleteClip(teamId, clipId),
    onSuccess: () => clipChanged(qc, teamId),
  });
}
