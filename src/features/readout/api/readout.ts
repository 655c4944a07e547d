import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ShotReadout } from "@shared/schemas/readout";
import { shotKeys } from "@/entities/shot";

/** GET /api/teams/:teamId/readout/shots/:shotId — 404 for a shot one may not see, 410 (staff) once deleted. */
export const fetchReadout = (teamId: string, shotId: string, signal?: AbortSignal) =>
  apiGet<ShotReadout>(`/teams/${encodeURIComponent(teamId)}/readout/shots/${encodeURIComponent(shotId)}`, undefined, signal);

export const readoutQueryOptions = (teamId: string, shotId: string) =>
  queryOptions({ queryKey: shotKeys.readout(teamId, shotId), queryFn: ({ signal }) => fetchReadout(teamId, shotId, signal), retry: false });

export const useReadout = (teamId: string, shotId: string, enabled = true) => useQuery({ ...readoutQueryOptions(teamId, shotId), enabled });
