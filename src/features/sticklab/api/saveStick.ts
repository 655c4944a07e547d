import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch, apiPost } from "@/lib/api";
import type { StickCreate, StickPatch, StickRow } from "@shared/schemas/sticks";
import { teamPath } from "@/entities/team";
import { stickChanged, stickPath } from "@/entities/stick";

/** POST /api/teams/:teamId/sticks (staff) → the new stick. */
export const createStick = (teamId: string, body: StickCreate) => apiPost<StickRow>(`${teamPath(teamId)}/sticks`, body);
/** PATCH /api/teams/:teamId/sticks/:stickId (staff) → the stick. */
export const updateStick = (teamId: string, stickId: string, patch: StickPatch) => apiPatch<StickRow>(stickPath(teamId, stickId), patch);

/** Create when `stickId` is undefined, else update. The form shows errors next to its fields. */
export function useSaveStick(teamId: string, stickId?: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StickCreate) => (stickId ? updateStick(teamId, stickId, body) : createStick(teamId, body)),
    meta: { toast: false },
    onSuccess: () => stickChanged(qc, teamId),
  });
}
