import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "@/lib/api";
import type { ShotDetail, UpdateShotBody } from "@shared/schemas/shots";
import { teamPath } from "@/entities/team";
import { shotAccessChanged } from "@/entities/shot";

/** PATCH /api/teams/:teamId/shots/:shotId — staff correct the label, frames, player or stick (audited). */
export const updateShot = (teamId: string, shotId: string, body: UpdateShotBody) =>
  apiPatch<ShotDetail>(`${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}`, body);

export function useUpdateShot(teamId: string, shotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateShotBody) => updateShot(teamId, shotId, body),
    meta: { toast: false }, // the dialog shows the message next to its field
    // A new player changes who may see the shot, and every list of shots, clips and progress with
    // it: everything of the team is fetched again.
    onSuccess: () => shotAccessChanged(qc, teamId),
  });
}
