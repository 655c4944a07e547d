import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet, type Query } from "@/lib/api";
import type { ClipListQuery, ClipPage } from "@shared/schemas/clips";
import { clipKeys, clipPath } from "@/entities/clip";

// GET /api/teams/:teamId/clips — filtered, sorted and paged on the server.
export const fetchClips = (teamId: string, q: ClipListQuery, signal?: AbortSignal) =>
  apiGet<ClipPage>(clipPath(teamId), q as Query, signal);

export const clipsQueryOptions = (teamId: string, q: ClipListQuery) =>
  queryOptions({
    queryKey: [...clipKeys.all(teamId), "list", q],
    queryFn: ({ signal }) => fetchClips(teamId, q, signal),
    placeholderData: keepPreviousData,
    // While a clip is being extracted its bar moves: poll until nothing is in progress.
    refetchInterval: (query) => (query.state.data?.items.some((c) => c.status === "extracting") ? 1000 : false),
  });

export const useClips = (teamId: string, q: ClipListQuery) => useQuery(clipsQueryOptions(teamId, q));
