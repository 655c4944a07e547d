import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { RosterResponse } from "@shared/schemas/roster";

/** Names of the team's members by user id (GET /api/teams/:teamId/members), so entries read as sentences. */
export const fetchMemberNames = (teamId: string, signal?: AbortSignal) =>
  apiGet<Partial<RosterResponse>>(`/teams/${encodeURIComponent(teamId)}/members`, undefined, signal).then(
    (r) => new Map((r.members ?? []).map((m) => [m.userId, m.name] as const)),
  );

export const memberNamesQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: ["teams", teamId, "audit", "names"] as const, queryFn: ({ signal }) => fetchMemberNames(teamId, signal) });

export const useMemberNames = (teamId: string) => useQuery(memberNamesQueryOptions(teamId));
