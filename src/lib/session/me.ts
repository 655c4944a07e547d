import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet, isApiError } from "../api";
import type { Me, TeamMembership } from "./types";

export const meKey = ["me"] as const;

/** GET /api/me, with "signed out" as a normal answer (null) rather than an error. */
export async function fetchMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await apiGet<Me>("/me", undefined, signal);
  } catch (e) {
    if (isApiError(e) && e.status === 401) return null;
    throw e;
  }
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: meKey, queryFn: ({ signal }) => fetchMe(signal), staleTime: 60_000 });

/** The signed-in person, or null when signed out. */
export function useMe() {
  return useQuery(meQueryOptions());
}

/** Inside the signed-in layout the guard has loaded /api/me, so this never returns null there. */
export function useSession(): Me {
  const { data } = useMe();
  if (!data) throw new Error("useSession() used outside the signed-in area");
  return data;
}

/** The team the person is working in now, or null when they belong to none. */
export function useActiveTeam(): TeamMembership | null {
  const { data } = useMe();
  if (!data) return null;
  return data.teams.find((t) => t.id === data.activeTeamId) ?? data.teams[0] ?? null;
}
