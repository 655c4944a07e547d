import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiGet, apiPatch } from "@/lib/api";
import type { ClipOptions } from "@shared/schemas/clips";
import type { ShotDetail, UpdateShotBody } from "@shared/schemas/shots";
import { teamPath } from "@/entities/team";
import { shotAccessChanged } from "@/entities/shot";
import { clipKeys } from "@/entities/clip";

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

// The team's players and sticks to choose from (GET …/clip-options, staff only; the same answer
// the clip form reads, so both share one cached copy).
const peopleOptions = (teamId: string) =>
  queryOptions({
    queryKey: clipKeys.options(teamId),
    queryFn: ({ signal }) => apiGet<ClipOptions>(`${teamPath(teamId)}/clip-options`, undefined, signal),
    staleTime: 60_000,
  });

export const usePlayersAndSticks = (teamId: string, enabled: boolean) => useQuery({ ...peopleOptions(teamId), enabled });
