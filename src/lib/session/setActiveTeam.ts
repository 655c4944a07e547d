import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPut } from "../api";
import { meKey } from "./me";
import type { Me } from "./types";

export const setActiveTeam = (teamId: string) => apiPut<Me>("/me/active-team", { teamId });

/** PUT /api/me/active-team; everything cached belonged to the old team, so drop it and refetch. */
export function useSetActiveTeam() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: setActiveTeam,
    onSuccess: async (me) => {
      qc.setQueryData(meKey, me);
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meKey[0], type: "inactive" });
      await qc.invalidateQueries({ predicate: (q) => q.queryKey[0] !== meKey[0] });
    },
  });
}
