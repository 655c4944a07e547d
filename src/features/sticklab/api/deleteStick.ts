import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { stickChanged, stickPath } from "@/entities/stick";

/** DELETE /api/teams/:teamId/sticks/:stickId (staff): the stick and its bench tests. */
export const deleteStick = (teamId: string, stickId: string) => apiDelete(stickPath(teamId, stickId));

export function useDeleteStick(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (stickId: string) => deleteStick(teamId, stickId),
    onSuccess: () => stickChanged(qc, teamId),
  });
}
