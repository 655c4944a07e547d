import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { clipShotsKey, teamPath } from "./keys";

/** DELETE /api/teams/:teamId/shots/:shotId — recorded in the audit log. */
export const deleteShot = (teamId: string, shotId: string) => apiDelete(`${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}`);

export function useDeleteShot(teamId: string, clipId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (shotId: string) => deleteShot(teamId, shotId), onSettled: () => qc.invalidateQueries({ queryKey: clipShotsKey(teamId, clipId) }) });
}
