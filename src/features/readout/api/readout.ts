import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ShotReadout } from "@shared/schemas/readout";
import { shotKeys } from "@/entities/shot";
import { RECOMPUTE_POLL_MS } from "@/lib/recompute";

/** GET /api/teams/:teamId/readout/shots/:shotId — 404 for a shot one may not see, 410 (staff) once deleted. */
export const fetchReadout = (teamId: string, shotId: string, signal?: AbortSignal) =>
  apiGet<ShotReadout>(`/teams/${encodeURIComponent(teamId)}/readout/shots/${encodeURIComponent(shotId)}`, undefined, signal);

export const readoutQueryOptions = (teamId: string, shotId: string) =>
  queryOptions({ queryKey: shotKeys.readout(teamId, shotId), queryFn: ({ signal }) => fetchReadout(teamId, shotId, signal), retry: false,
    // New results are on their way from the job queue: look again until they are stored.
    refetchInterval: (q) => (q.state.data?.recomputing ? RECOMPUTE_POLL_MS : false) });

export const useReadout = (teamId: string, shotId: string, enabled = true) => useQuery({ ...readoutQueryOptions(teamId, shotId), enabled });
