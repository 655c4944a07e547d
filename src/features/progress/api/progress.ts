import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ProgressQuery, ProgressResponse } from "@shared/schemas/readout";
import { shotKeys } from "@/entities/shot";

/** GET /api/teams/:teamId/readout/progress — one player's results across sessions, best and typical values. */
export const progressQueryOptions = (teamId: string, q: ProgressQuery) =>
  queryOptions({
    queryKey: shotKeys.progress(teamId, q),
    queryFn: ({ signal }) => apiGet<ProgressResponse>(`/teams/${encodeURIComponent(teamId)}/readout/progress`, { ...q }, signal),
    placeholderData: keepPreviousData,
    retry: false,
  });

export const useProgress = (teamId: string, q: ProgressQuery, enabled: boolean) => useQuery({ ...progressQueryOptions(teamId, q), enabled });
