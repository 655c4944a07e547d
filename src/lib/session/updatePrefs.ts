import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPatch } from "../api";
import { meKey } from "./me";
import type { Me, Prefs } from "./types";

export const updatePrefs = (patch: Partial<Prefs>) => apiPatch<Prefs>("/me/prefs", patch);

/** PATCH /api/me/prefs, shown at once (optimistic) and rolled back if the server refuses. */
export function useUpdatePrefs() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updatePrefs,
    onMutate: async (patch) => {
      await qc.cancelQueries({ queryKey: meKey });
      const before = qc.getQueryData<Me | null>(meKey);
      if (before) qc.setQueryData<Me>(meKey, { ...before, prefs: { ...before.prefs, ...patch } });
      return { before };
    },
    onError: (_e, _patch, ctx) => {
      if (ctx?.before) qc.setQueryData(meKey, ctx.before);
    },
    onSuccess: (prefs) => {
      const now = qc.getQueryData<Me | null>(meKey);
      if (now) qc.setQueryData<Me>(meKey, { ...now, prefs });
    },
  });
}
