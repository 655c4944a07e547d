import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete, apiPut } from "@/lib/api";
import type { PublishResponse, PublishShotBody } from "@shared/schemas/readout";
import { shotsChanged } from "@/entities/shot";

const path = (teamId: string, shotId: string) => `/teams/${encodeURIComponent(teamId)}/readout/shots/${encodeURIComponent(shotId)}/publication`;

/** PUT …/publication publishes the shot to its player; DELETE takes it back to review (coach, team admin). */
export function usePublishShot(teamId: string, shotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { publish: true; body: PublishShotBody } | { publish: false }) =>
      v.publish ? apiPut<PublishResponse>(path(teamId, shotId), v.body) : apiDelete<PublishResponse>(path(teamId, shotId)),
    onSettled: () => shotsChanged(qc, teamId),
  });
}
