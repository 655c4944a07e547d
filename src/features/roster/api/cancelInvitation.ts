import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { memberKeys } from "@/entities/member";

/** DELETE /api/teams/:teamId/invitations/:invitationId */
export const cancelInvitation = (teamId: string, invitationId: string) =>
  apiDelete(`/teams/${encodeURIComponent(teamId)}/invitations/${encodeURIComponent(invitationId)}`);

export function useCancelInvitation(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => cancelInvitation(teamId, invitationId),
    onSuccess: () => qc.invalidateQueries({ queryKey: memberKeys.roster(teamId) }),
  });
}
