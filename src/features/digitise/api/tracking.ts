import { useEffect } from "react";
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiDelete, apiGet, apiPost } from "@/lib/api";
import { env } from "@/lib/env";
import type { StartTrackingBody, TrackingAnswer, TrackingRun } from "@shared/schemas/tracking";
import { teamPath } from "@/entities/team";
import { shotKeys } from "@/entities/shot";

// The auto-digitise run of a shot: read the newest, start one from seeds, cancel it, and follow
// its progress as server-sent events while it is queued or running.

export const trackingKey = shotKeys.tracking;
const path = (teamId: string, shotId: string) => `${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}/tracking`;

export const trackingQueryOptions = (teamId: string, shotId: string) =>
  queryOptions({ queryKey: trackingKey(teamId, shotId), queryFn: ({ signal }) => apiGet<TrackingAnswer>(path(teamId, shotId), undefined, signal), staleTime: 5_000, retry: 1 });

const isLive = (r: TrackingRun | null | undefined) => r?.status === "queued" || r?.status === "running";

/** The shot's newest run, kept up to date by the progress stream while it works. */
export function useTrackingRun(teamId: string, shotId: string) {
  const qc = useQueryClient();
  const q = useQuery(trackingQueryOptions(teamId, shotId));
  const live = isLive(q.data?.run);
  useEffect(() => {
    if (!live) return;
    const source = new EventSource(`${env.apiBase}${path(teamId, shotId)}`);
    source.addEventListener("run", (e) => {
      const run = JSON.parse((e as MessageEvent<string>).data) as TrackingRun;
      qc.setQueryData<TrackingAnswer>(trackingKey(teamId, shotId), { run });
      if (!isLive(run)) source.close();
    });
    source.addEventListener("none", () => source.close());
    return () => source.close();
  }, [teamId, shotId, live, qc]);
  return q;
}

export function useStartTracking(teamId: string, shotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StartTrackingBody) => apiPost<{ run: TrackingRun; started: boolean }>(path(teamId, shotId), body),
    onSuccess: (r) => qc.setQueryData<TrackingAnswer>(trackingKey(teamId, shotId), { run: r.run }),
  });
}

export function useCancelTracking(teamId: string, shotId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => apiDelete(path(teamId, shotId)),
    onSettled: () => qc.invalidateQueries({ queryKey: trackingKey(teamId, shotId) }),
  });
}
