import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { ClipShots } from "@shared/schemas/shots";
import { teamPath } from "@/entities/team";
import { shotKeys } from "@/entities/shot";
import { RECOMPUTE_POLL_MS } from "@/lib/recompute";

/** GET /api/teams/:teamId/clips/:clipId/shots — the clip and the shots the caller may see. */
export const fetchClipShots = (teamId: string, clipId: string, signal?: AbortSignal) =>
  apiGet<ClipShots>(`${teamPath(teamId)}/clips/${encodeURIComponent(clipId)}/shots`, undefined, signal);

export const clipShotsQueryOptions = (teamId: string, clipId: string) =>
  queryOptions({
    queryKey: shotKeys.ofClip(teamId, clipId), queryFn: ({ signal }) => fetchClipShots(teamId, clipId, signal),
    refetchInterval: (q) => (q.state.data?.shots.some((s) => s.result?.recomputing) ? RECOMPUTE_POLL_MS : false),
  });

export const useClipShots = (teamId: string, clipId: string) => useQuery(clipShotsQueryOptions(teamId, clipId));
