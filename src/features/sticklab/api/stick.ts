import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { StickDetail } from "@shared/schemas/sticks";
import { stickKeys, stickPath } from "@/entities/stick";

/** GET /api/teams/:teamId/sticks/:stickId — the stick, its bench tests (oldest first) and its shots. */
export const fetchStick = (teamId: string, stickId: string, signal?: AbortSignal) => apiGet<StickDetail>(stickPath(teamId, stickId), undefined, signal);

export const stickQueryOptions = (teamId: string, stickId: string) =>
  queryOptions({ queryKey: stickKeys.one(teamId, stickId), queryFn: ({ signal }) => fetchStick(teamId, stickId, signal) });

export const useStick = (teamId: string, stickId: string) => useQuery(stickQueryOptions(teamId, stickId));
