import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiDelete, apiGet } from "@/lib/api";
import type { ClipDeletionCounts } from "@shared/schemas/clips";
import { clipChanged, clipKeys, clipPath } from "@/entities/clip";

/** DELETE /api/teams/:teamId/clips/:clipId — removes the clip, its frames, files and shots. */
export const deleteClip = (teamId: string, clipId: string) => apiDelete(clipPath(teamId, clipId));

export function useDeleteClip(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (clipId: string) => deleteClip(teamId, clipId),
    onSuccess: () => clipChanged(qc, teamId),
  });
}

/** GET …/clips/:clipId/deletion while the delete dialog is open: always counted afresh. */
export const useClipDeletionCounts = (teamId: string, clipId: string, open: boolean) =>
  useQuery({
    queryKey: [...clipKeys.one(teamId, clipId), "deletion"],
    queryFn: ({ signal }) => apiGet<ClipDeletionCounts>(`${clipPath(teamId, clipId)}/deletion`, undefined, signal),
    enabled: open,
    staleTime: 0,
    gcTime: 0,
  });
