import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ShotBeamResponse } from "@shared/schemas/sticks";
import { teamPath } from "@/entities/team";
import { shotKeys } from "@/entities/shot";

/** GET /api/teams/:teamId/beam/shots/:shotId — the beam a digitised shot puts on its stick. 422 says what the shot lacks. */
export const fetchShotBeam = (teamId: string, shotId: string, signal?: AbortSignal) =>
  apiGet<ShotBeamResponse>(`${teamPath(teamId)}/beam/shots/${encodeURIComponent(shotId)}`, undefined, signal);

export const shotBeamQueryOptions = (teamId: string, shotId: string) =>
  queryOptions({ queryKey: shotKeys.beam(teamId, shotId), queryFn: ({ signal }) => fetchShotBeam(teamId, shotId, signal), meta: { toast: false } });

export const useShotBeam = (teamId: string, shotId: string | null) => useQuery({ ...shotBeamQueryOptions(teamId, shotId ?? ""), enabled: !!shotId });
