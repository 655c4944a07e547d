import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import type { CreateShotBody, ShotDetail } from "@shared/schemas/shots";
import { teamPath } from "@/entities/team";
import { shotKeys, shotsChanged } from "@/entities/shot";

/** POST /api/teams/:teamId/clips/:clipId/shots — player and stick default to the clip's. */
export const createShot = (teamId: string, clipId: string, body: CreateShotBody) =>
  apiPost<ShotDetail>(`${teamPath(teamId)}/clips/${encodeURIComponent(clipId)}/shots`, body);

export function useCreateShot(teamId: string, clipId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateShotBody) => createShot(teamId, clipId, body),
    onSuccess: (shot) => {
      qc.setQueryData(shotKeys.document(teamId, shot.id), shot);
      return shotsChanged(qc, teamId, { keepDocument: shot.id });
    },
  });
}
