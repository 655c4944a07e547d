import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import type { CreateShotBody, ShotDetail } from "@shared/schemas/shots";
import { clipShotsKey, shotKey, teamPath } from "./keys";

/** POST /api/teams/:teamId/clips/:clipId/shots — player and stick default to the clip's. */
export const createShot = (teamId: string, clipId: string, body: CreateShotBody) =>
  apiPost<ShotDetail>(`${teamPath(teamId)}/clips/${encodeURIComponent(clipId)}/shots`, body);

export function useCreateShot(teamId: string, clipId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateShotBody) => createShot(teamId, clipId, body),
    onSuccess: (shot) => {
      qc.setQueryData(shotKey(teamId, shot.id), shot);
      return qc.invalidateQueries({ queryKey: clipShotsKey(teamId, clipId) });
    },
  });
}
