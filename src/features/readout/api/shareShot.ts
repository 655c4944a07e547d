import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete, apiPost } from "@/lib/api";
import type { ShareResponse, ShareShotBody } from "@shared/schemas/readout";
import { shotsChanged } from "@/entities/shot";

/** POST /api/teams/:teamId/readout/shots/:shotId/shares — coach or team admin. */
export const shareShot = (teamId: string, shotId: string, body: ShareShotBody) =>
  apiPost<ShareResponse>(`/teams/${encodeURIComponent(teamId)}/readout/shots/${encodeURIComponent(shotId)}/shares`, body);

export function useShareShot(teamId: string, shotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ShareShotBody) => shareShot(teamId, shotId, body),
    onSettled: () => shotsChanged(qc, teamId),
  });
}

/** DELETE /api/teams/:teamId/readout/shots/:shotId/shares/:userId — coach or team admin. */
export function useUnshareShot(teamId: string, shotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => apiDelete(`/teams/${encodeURIComponent(teamId)}/readout/shots/${encodeURIComponent(shotId)}/shares/${encodeURIComponent(userId)}`),
    onSettled: () => shotsChanged(qc, teamId),
    meta: { errorTitle: "Could not stop sharing" },
  });
}
