import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import { meKey } from "@/lib/session";

/** POST /api/auth/sign-out */
export const signOut = () => apiPost<unknown>("/auth/sign-out");

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    meta: { authRedirect: false },
    // Whatever the server said, nothing of the old session stays in this tab. (Not qc.clear():
    // that would also drop this mutation before the caller's own onSettled has run.)
    onSettled: () => {
      qc.setQueryData(meKey, null);
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meKey[0] });
    },
  });
}
