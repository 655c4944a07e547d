import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ShotDetail } from "@shared/schemas/shots";
import { shotKey, teamPath } from "./keys";

/** GET /api/teams/:teamId/shots/:shotId — marks, events, version, the clip's calibration and the stored results. */
export const fetchShot = (teamId: string, shotId: string, signal?: AbortSignal) =>
  apiGet<ShotDetail>(`${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}`, undefined, signal);

// The page keeps its own working copy while digitising; the query is only its starting point.
export const shotQueryOptions = (teamId: string, shotId: string) =>
  queryOptions({ queryKey: shotKey(teamId, shotId), queryFn: ({ signal }) => fetchShot(teamId, shotId, signal), staleTime: Infinity, refetchOnWindowFocus: false, retry: 1 });

export const useShot = (teamId: string, shotId: string) => useQuery(shotQueryOptions(teamId, shotId));
