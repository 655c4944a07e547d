import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import { SHOTS_PAGE_MAX, type ShotListResponse } from "@shared/schemas/readout";
import { shotKeys } from "@/entities/shot";

/**
 * The shots one may put side by side (GET /api/teams/:teamId/readout/shots): the newest
 * SHOTS_PAGE_MAX. Older ones are reached from the Shots page, whose filters and pages cover all.
 */
export const shotChoicesQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: shotKeys.list(teamId, { pageSize: SHOTS_PAGE_MAX }),
    queryFn: ({ signal }) => apiGet<ShotListResponse>(`/teams/${encodeURIComponent(teamId)}/readout/shots`, { pageSize: SHOTS_PAGE_MAX }, signal),
  });

export const useShotChoices = (teamId: string) => useQuery(shotChoicesQueryOptions(teamId));
