import { useMutation, useQueryClient } from "@tanstack/react-query";
import { ApiError, apiPost, type FieldProblem } from "@/lib/api";
import { env } from "@/lib/env";
import type { BenchTestInput, BenchTestRow } from "@shared/schemas/sticks";
import { isProblemCode } from "@shared/schemas/problem-codes";
import { stickChanged, stickPath } from "@/entities/stick";

/** POST /api/teams/:teamId/sticks/:stickId/bench-tests — readings from the table. */
export const addBenchTest = (teamId: string, stickId: string, body: BenchTestInput) =>
  apiPost<BenchTestRow>(`${stickPath(teamId, stickId)}/bench-tests`, body);

export interface BenchCsvUpload {
  file: File;
  date: string;
  spanMm?: number;
  loadPointMm?: number;
}

/** POST …/bench-tests/csv as multipart (the shared JSON helper cannot send files); errors become ApiError like everywhere else. */
export async function uploadBenchCsv(teamId: string, stickId: string, u: BenchCsvUpload): Promise<BenchTestRow> {
  const form = new FormData();
  form.set("date", u.date);
  if (u.spanMm !== undefined) form.set("spanMm", String(u.spanMm));
  if (u.loadPointMm !== undefined) form.set("loadPointMm", String(u.loadPointMm));
  form.set("file", u.file, u.file.name);
  let res: Response;
  try {
    res = await fetch(`${env.apiBase}${stickPath(teamId, stickId)}/bench-tests/csv`, { method: "POST", body: form, credentials: "same-origin", headers: { Accept: "application/json, application/problem+json" } });
  } catch {
    throw new ApiError({ status: 0, code: "network_error", detail: "Can't reach the Loadframe server. Check your connection and try again." });
  }
  const body = (await res.json().catch(() => null)) as (Partial<BenchTestRow> & { code?: string; detail?: string; errors?: FieldProblem[] }) | null;
  if (!res.ok) throw new ApiError({ status: res.status, code: isProblemCode(body?.code) ? body.code : "http_error", detail: body?.detail ?? `Upload failed (${res.status}).`, errors: body?.errors });
  return body as BenchTestRow;
}

export type BenchSubmission = { kind: "table"; body: BenchTestInput } | { kind: "csv"; upload: BenchCsvUpload };

export function useAddBenchTest(teamId: string, stickId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (s: BenchSubmission) => (s.kind === "table" ? addBenchTest(teamId, stickId, s.body) : uploadBenchCsv(teamId, stickId, s.upload)),
    meta: { toast: false },
    onSuccess: () => stickChanged(qc, teamId),
  });
}
