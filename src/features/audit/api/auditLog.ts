import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";

/** One row of GET /api/teams/:teamId/audit (newest first, the last 200). */
export interface AuditEntry {
  id: string;
  action: string;
  targetType: string;
  targetId: string | null;
  detail: Record<string, unknown>;
  createdAt: string;
  actorName: string | null;
}

export const auditKey = (teamId: string) => ["teams", teamId, "audit"] as const;

export const fetchAuditLog = (teamId: string, signal?: AbortSignal) =>
  apiGet<{ entries: AuditEntry[] }>(`/teams/${encodeURIComponent(teamId)}/audit`, undefined, signal).then((r) => r.entries ?? []);

export const auditLogQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: auditKey(teamId), queryFn: ({ signal }) => fetchAuditLog(teamId, signal) });

export const useAuditLog = (teamId: string) => useQuery(auditLogQueryOptions(teamId));
