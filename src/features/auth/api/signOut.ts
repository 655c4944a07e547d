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
    // Whatever the server said, nothing of the old session stays in this tab.
    onSettled: () => {
      qc.clear();
      qc.setQueryData(meKey, null);
    },
  });
}
