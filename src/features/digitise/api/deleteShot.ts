import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { teamPath } from "@/entities/team";
import { shotsChanged } from "@/entities/shot";

/** DELETE /api/teams/:teamId/shots/:shotId — recorded in the audit log. */
export const deleteShot = (teamId: string, shotId: string) => apiDelete(`${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}`);

export function useDeleteShot(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (shotId: string) => deleteShot(teamId, shotId), onSettled: () => shotsChanged(qc, teamId), meta: { errorTitle: "Couldn't delete the shot" } });
}
