import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import { meKey, meQueryOptions } from "@/lib/session";
import type { SignInInput } from "../schemas";

/** POST /api/auth/sign-in/email — better-auth sets the session cookie. */
export const signIn = (input: SignInInput) => apiPost<unknown>("/auth/sign-in/email", input);

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    // A 401 here means "wrong e-mail or password"; the form shows it.
    meta: { toast: false, authRedirect: false },
    onSuccess: async () => {
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meKey[0] });
      await qc.fetchQuery({ ...meQueryOptions(), staleTime: 0 });
    },
  });
}
