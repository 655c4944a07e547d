import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ShotListResponse } from "@shared/schemas/readout";

/** The shots one may put side by side (GET /api/teams/:teamId/readout/shots). */
export const shotChoicesQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ["teams", teamId, "readout", "shots", {}],
    queryFn: ({ signal }) => apiGet<ShotListResponse>(`/teams/${encodeURIComponent(teamId)}/readout/shots`, undefined, signal),
  });

export const useShotChoices = (teamId: string) => useQuery(shotChoicesQueryOptions(teamId));
