import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ClipDetail } from "@shared/schemas/clips";
import { clipKeys, clipPath } from "@/entities/clip";

// GET /api/teams/:teamId/clips/:clipId
export const fetchClip = (teamId: string, clipId: string, signal?: AbortSignal) => apiGet<ClipDetail>(clipPath(teamId, clipId), undefined, signal);

export const clipQueryOptions = (teamId: string, clipId: string) =>
  queryOptions({ queryKey: clipKeys.one(teamId, clipId), queryFn: ({ signal }) => fetchClip(teamId, clipId, signal) });

export const useClip = (teamId: string, clipId: string) => useQuery(clipQueryOptions(teamId, clipId));
