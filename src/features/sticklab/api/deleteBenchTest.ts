import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiDelete } from "@/lib/api";
import { stickChanged, stickPath } from "@/entities/stick";

/** DELETE /api/teams/:teamId/sticks/:stickId/bench-tests/:testId (staff). */
export const deleteBenchTest = (teamId: string, stickId: string, testId: string) =>
  apiDelete(`${stickPath(teamId, stickId)}/bench-tests/${encodeURIComponent(testId)}`);

export function useDeleteBenchTest(teamId: string, stickId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (testId: string) => deleteBenchTest(teamId, stickId, testId),
    onSuccess: () => stickChanged(qc, teamId),
  });
}
