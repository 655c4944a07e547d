import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "@/lib/api";
import type { StickSettings } from "@shared/schemas/sticks";
import { sticksKey, teamPath } from "./keys";

/** PATCH /api/teams/:teamId/stick-lab/settings (team admin). */
export const updateStickSettings = (teamId: string, body: StickSettings) => apiPatch<StickSettings>(`${teamPath(teamId)}/stick-lab/settings`, body);

export function useUpdateStickSettings(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StickSettings) => updateStickSettings(teamId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: sticksKey(teamId) }),
  });
}
