import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { PlayersResponse } from "@shared/schemas/readout";
import { shotKeys } from "@/entities/shot";

/** GET /api/teams/:teamId/readout/players — staff: the team's players (with the shots they see of each); a player: only themself. Progress picks a player from it, the share dialog a teammate. */
export const playersQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: shotKeys.players(teamId),
    queryFn: ({ signal }) => apiGet<PlayersResponse>(`/teams/${encodeURIComponent(teamId)}/readout/players`, undefined, signal),
  });

export const usePlayers = (teamId: string) => useQuery(playersQueryOptions(teamId));
