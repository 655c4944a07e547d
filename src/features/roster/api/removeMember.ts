import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { memberKeys } from "@/entities/member";

/** DELETE /api/teams/:teamId/members/:memberId — 409 last_admin. */
export const removeMember = (teamId: string, memberId: string) =>
  apiDelete(`/teams/${encodeURIComponent(teamId)}/members/${encodeURIComponent(memberId)}`);

export function useRemoveMember(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (memberId: string) => removeMember(teamId, memberId),
    onSuccess: () => qc.invalidateQueries({ queryKey: memberKeys.roster(teamId) }),
  });
}
