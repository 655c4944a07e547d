import { queryOptions, useQuery } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { apiGet } from "@/lib/api";
import type { ShotDetail } from "@shared/schemas/shots";
import { teamPath } from "@/entities/team";
import { shotKeys } from "@/entities/shot";

/** GET /api/teams/:teamId/shots/:shotId — marks, events, version, the clip's calibration and the stored results. */
export const fetchShot = (teamId: string, shotId: string, signal?: AbortSignal) =>
  apiGet<ShotDetail>(`${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}`, undefined, signal);

// The page keeps its own working copy while digitising; the query is its starting point. The
// autosave writes each save through to it (entities/shot: shotMarksSaved), and opening the page
// always asks the server again, so coming back never starts from an older version.
export const shotQueryOptions = (teamId: string, shotId: string) =>
  queryOptions({ queryKey: shotKeys.document(teamId, shotId), queryFn: ({ signal }) => fetchShot(teamId, shotId, signal), refetchOnWindowFocus: false, retry: 1 });

/**
 * The shot as the server holds it when the page opens: cached data counts only once refetched on
 * this visit. `opened` then stays the same object for the life of the page (the workspace keeps
 * its own working copy; later cache updates must not restart it).
 */
export function useShot(teamId: string, shotId: string) {
  const q = useQuery({ ...shotQueryOptions(teamId, shotId), refetchOnMount: "always" });
  const [opened, setOpened] = useState<{ shotId: string; shot: ShotDetail } | null>(null);
  const fresh = q.isFetchedAfterMount && !q.isFetching && q.data?.id === shotId ? q.data : undefined;
  useEffect(() => {
    if (fresh && opened?.shotId !== shotId) setOpened({ shotId, shot: fresh });
  }, [fresh, opened, shotId]);
  return { ...q, current: opened?.shotId === shotId ? opened.shot : fresh };
}
