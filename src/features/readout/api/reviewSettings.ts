import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiGet, apiPatch } from "@/lib/api";
import type { ReviewSettings } from "@shared/schemas/readout";
import { shotKeys, shotsChanged } from "@/entities/shot";

const path = (teamId: string) => `/teams/${encodeURIComponent(teamId)}/readout/settings`;

/** GET …/readout/settings — whether the team publishes results without a coach's review. */
export const reviewSettingsQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: shotKeys.reviewSettings(teamId), queryFn: ({ signal }) => apiGet<ReviewSettings>(path(teamId), undefined, signal) });

export const useReviewSettings = (teamId: string) => useQuery(reviewSettingsQueryOptions(teamId));

/** PATCH …/readout/settings — team admin. Switching auto-publish on also publishes what waits with results. */
export function useUpdateReviewSettings(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ReviewSettings) => apiPatch<ReviewSettings>(path(teamId), body),
    // Switching auto-publish on also publishes shots: the setting and every view of shots refetch.
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: shotKeys.reviewSettings(teamId) }), shotsChanged(qc, teamId)]),
  });
}
