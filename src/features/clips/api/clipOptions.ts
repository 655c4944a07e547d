import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ClipOptions } from "@shared/schemas/clips";
import { clipKeys } from "@/entities/clip";

// GET /api/teams/:teamId/clip-options — sessions, players and sticks for the clip form (staff only).
export const fetchClipOptions = (teamId: string, signal?: AbortSignal) =>
  apiGet<ClipOptions>(`/teams/${encodeURIComponent(teamId)}/clip-options`, undefined, signal);

export const clipOptionsQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: clipKeys.options(teamId), queryFn: ({ signal }) => fetchClipOptions(teamId, signal), staleTime: 60_000 });

export const useClipOptions = (teamId: string, enabled = true) => useQuery({ ...clipOptionsQueryOptions(teamId), enabled });
