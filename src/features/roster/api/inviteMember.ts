import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import type { Role } from "@/lib/roles";
import type { Invitation } from "@/entities/member";
import { memberKeys } from "@/entities/member";

/** POST /api/teams/:teamId/invitations — mails the invitee a link. 409 already_member / already_invited. */
export const inviteMember = (teamId: string, body: { email: string; role: Role }) =>
  apiPost<Invitation>(`/teams/${encodeURIComponent(teamId)}/invitations`, body);

export function useInviteMember(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: { email: string; role: Role }) => inviteMember(teamId, body),
    meta: { toast: false }, // the invite form shows it next to the e-mail field
    onSuccess: () => qc.invalidateQueries({ queryKey: memberKeys.roster(teamId) }),
  });
}
