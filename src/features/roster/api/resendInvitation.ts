import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import type { Invitation } from "@/entities/member";
import { memberKeys } from "@/entities/member";

/** POST /api/teams/:teamId/invitations/:invitationId/resend */
export const resendInvitation = (teamId: string, invitationId: string) =>
  apiPost<Invitation>(`/teams/${encodeURIComponent(teamId)}/invitations/${encodeURIComponent(invitationId)}/resend`);

export function useResendInvitation(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => resendInvitation(teamId, invitationId),
    onSuccess: () => qc.invalidateQueries({ queryKey: memberKeys.roster(teamId) }),
  });
}
