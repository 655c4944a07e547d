import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "@/lib/api";
import type { Role } from "@/lib/roles";
import { meKey } from "@/lib/session";
import type { Member } from "@/entities/member";
import { memberKeys } from "@/entities/member";

/** PATCH /api/teams/:teamId/members/:memberId — 409 last_admin when it would leave the team without one. */
export const changeRole = (teamId: string, memberId: string, role: Role) =>
  apiPatch<Member>(`/teams/${encodeURIComponent(teamId)}/members/${encodeURIComponent(memberId)}`, { role });

export function useChangeRole(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: Role }) => changeRole(teamId, memberId, role),
    onSettled: async () => {
      await qc.invalidateQueries({ queryKey: memberKeys.roster(teamId) });
      await qc.invalidateQueries({ queryKey: meKey }); // one's own role may be the one that changed
    },
  });
}
