import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { SticksResponse } from "@shared/schemas/sticks";
import { teamPath } from "@/entities/team";
import { stickKeys } from "@/entities/stick";

/** GET /api/teams/:teamId/sticks — staff get every stick, a player their own. */
export const fetchSticks = (teamId: string, signal?: AbortSignal) => apiGet<SticksResponse>(`${teamPath(teamId)}/sticks`, undefined, signal);

export const sticksQueryOptions = (teamId: string) => queryOptions({ queryKey: stickKeys.all(teamId), queryFn: ({ signal }) => fetchSticks(teamId, signal) });

export const useSticks = (teamId: string) => useQuery(sticksQueryOptions(teamId));
