import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { RosterResponse } from "@shared/schemas/roster";
import { memberKeys } from "@/entities/member";

// GET /api/teams/:teamId/members (docs/api.md); shapes from the shared schema.
export type { MemberRow as Member, InvitationRow as Invitation, RosterResponse as Roster } from "@shared/schemas/roster";

export const fetchRoster = (teamId: string, signal?: AbortSignal) =>
  apiGet<Partial<RosterResponse>>(`/teams/${encodeURIComponent(teamId)}/members`, undefined, signal).then((r) => ({
    members: r.members ?? [],
    invitations: r.invitations ?? [],
  }));

export const rosterQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: memberKeys.roster(teamId), queryFn: ({ signal }) => fetchRoster(teamId, signal) });

export const useRoster = (teamId: string) => useQuery(rosterQueryOptions(teamId));
