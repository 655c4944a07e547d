import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ShotListPageQuery, ShotListResponse } from "@shared/schemas/readout";
import { RECOMPUTE_POLL_MS } from "@/lib/recompute";
import { teamPath } from "../team";
import { shotKeys } from "./keys";

/** GET /api/teams/:teamId/readout/shots — staff: the team's shots; a player: own and shared ones.
 * The Shots page reads its pages through it, side by side its choices. */
export const fetchShots = (teamId: string, f: ShotListPageQuery, signal?: AbortSignal) =>
  apiGet<ShotListResponse>(`${teamPath(teamId)}/readout/shots`, { ...f }, signal);

export const shotsQueryOptions = (teamId: string, f: ShotListPageQuery) =>
  queryOptions({ queryKey: shotKeys.list(teamId, f), queryFn: ({ signal }) => fetchShots(teamId, f, signal), placeholderData: keepPreviousData,
    refetchInterval: (q) => (q.state.data?.shots.some((s) => s.recomputing) ? RECOMPUTE_POLL_MS : false) });

export const useShots = (teamId: string, f: ShotListPageQuery) => useQuery(shotsQueryOptions(teamId, f));
