import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { CompareResponse } from "@shared/schemas/readout";
import { shotKeys } from "@/entities/shot";

/** GET /api/teams/:teamId/readout/compare?a=&b= — both readouts, or 404 naming the shot that is not found. */
export const fetchCompare = (teamId: string, a: string, b: string, signal?: AbortSignal) =>
  apiGet<CompareResponse>(`/teams/${encodeURIComponent(teamId)}/readout/compare`, { a, b }, signal);

export const compareQueryOptions = (teamId: string, a: string, b: string) =>
  queryOptions({ queryKey: shotKeys.compare(teamId, a, b), queryFn: ({ signal }) => fetchCompare(teamId, a, b, signal), retry: false });

export const useCompare = (teamId: string, a: string, b: string, enabled: boolean) => useQuery({ ...compareQueryOptions(teamId, a, b), enabled });
