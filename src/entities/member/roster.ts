import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { RosterResponse } from "@shared/schemas/roster";
import { teamPath } from "../team";
import { memberKeys } from "./keys";

// GET /api/teams/:teamId/members (docs/api.md): the roster page's members and invitations, and the
// names the audit log writes its entries with. Shapes from the shared schema.
export type { MemberRow as Member, InvitationRow as Invitation, RosterResponse as Roster } from "@shared/schemas/roster";

export const fetchRoster = (teamId: string, signal?: AbortSignal) =>
  apiGet<Partial<RosterResponse>>(`${teamPath(teamId)}/members`, undefined, signal).then((r) => ({
    members: r.members ?? [],
    invitations: r.invitations ?? [],
  }));

export const rosterQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: memberKeys.roster(teamId), queryFn: ({ signal }) => fetchRoster(teamId, signal) });

export const useRoster = (teamId: string) => useQuery(rosterQueryOptions(teamId));

const namesById = (r: Awaited<ReturnType<typeof fetchRoster>>) => new Map(r.members.map((m) => [m.userId, m.name] as const));

/** Names of the team's members by user id, from the same answer (one request, one cache entry). */
export const useMemberNames = (teamId: string) => useQuery({ ...rosterQueryOptions(teamId), select: namesById });
