import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { HomeResponse } from "@shared/schemas/home";
import { shotKeys } from "@/entities/shot";

/** GET …/home — what needs the signed-in member now, by their role in the team. */
export const homeQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: shotKeys.home(teamId),
    queryFn: ({ signal }) => apiGet<HomeResponse>(`/teams/${encodeURIComponent(teamId)}/home`, undefined, signal),
    // Running jobs and new uploads change it: fresh on every visit, and while it stays open.
    staleTime: 0,
    refetchInterval: 30_000,
  });

export const useHome = (teamId: string) => useQuery(homeQueryOptions(teamId));
