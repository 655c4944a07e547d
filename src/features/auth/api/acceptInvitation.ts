import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import { meKey, meQueryOptions, setActiveTeam } from "@/lib/session";

/**
 * POST /api/invitations/:id/accept — `{ name, password }` creates the account, `{}` joins as the
 * signed-in person. Either way the new team becomes the active one.
 */
export const acceptInvitation = ({ id, ...body }: { id: string; name?: string; password?: string }) =>
  apiPost<{ teamId: string }>(`/invitations/${encodeURIComponent(id)}/accept`, body);

export function useAcceptInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    meta: { toast: false, authRedirect: false },
    onSuccess: async ({ teamId }, { id }) => {
      await setActiveTeam(teamId).catch(() => undefined); // the server may already have done it
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meKey[0] });
      qc.removeQueries({ queryKey: ["invitations", id] });
      await qc.fetchQuery({ ...meQueryOptions(), staleTime: 0 });
    },
  });
}
