import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ClipOptions } from "@shared/schemas/clips";
import { teamPath } from "../team";
import { clipKeys } from "./keys";

// GET /api/teams/:teamId/clip-options — the team's sessions, players and sticks (staff only): the
// clip form's choices and the players and sticks a shot can be corrected to, one cached copy.
export const fetchClipOptions = (teamId: string, signal?: AbortSignal) => apiGet<ClipOptions>(`${teamPath(teamId)}/clip-options`, undefined, signal);

export const clipOptionsQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: clipKeys.options(teamId), queryFn: ({ signal }) => fetchClipOptions(teamId, signal), staleTime: 60_000 });

export const useClipOptions = (teamId: string, enabled = true) => useQuery({ ...clipOptionsQueryOptions(teamId), enabled });
