import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ClipDetail } from "@shared/schemas/clips";
import { clipKey, clipPath } from "./keys";

// GET /api/teams/:teamId/clips/:clipId
export const fetchClip = (teamId: string, clipId: string, signal?: AbortSignal) => apiGet<ClipDetail>(clipPath(teamId, clipId), undefined, signal);

export const clipQueryOptions = (teamId: string, clipId: string) =>
  queryOptions({ queryKey: clipKey(teamId, clipId), queryFn: ({ signal }) => fetchClip(teamId, clipId, signal) });

export const useClip = (teamId: string, clipId: string) => useQuery(clipQueryOptions(teamId, clipId));
