import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "@/lib/api";
import type { StickSettings } from "@shared/schemas/sticks";
import { teamPath } from "@/entities/team";
import { stickChanged } from "@/entities/stick";

/** PATCH /api/teams/:teamId/stick-lab/settings (team admin). */
export const updateStickSettings = (teamId: string, body: StickSettings) => apiPatch<StickSettings>(`${teamPath(teamId)}/stick-lab/settings`, body);

export function useUpdateStickSettings(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StickSettings) => updateStickSettings(teamId, body),
    onSuccess: () => stickChanged(qc, teamId),
    meta: { toast: false }, // the alert level card shows it under its field
  });
}
