import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiGet, apiPost } from "@/lib/api";
import { meKey, meQueryOptions } from "@/lib/session";
import type { SignupComplete } from "@shared/schemas/signup";

/** POST /api/signup — mails a one-time link to the address (the answer never says whether it has an account). */
export const requestSignup = ({ email }: { email: string }) => apiPost<{ sent: true; email: string }>("/signup", { email });
export const useRequestSignup = () => useMutation({ mutationFn: requestSignup, meta: { toast: false, authRedirect: false } });

/** GET /api/signup/:token — the address the link was sent to (404 unknown, 410 used or expired). */
export const useSignupLink = (token: string) =>
  useQuery({ queryKey: ["signup", token], queryFn: () => apiGet<{ email: string }>(`/signup/${encodeURIComponent(token)}`), retry: false, meta: { authRedirect: false } });

/** POST /api/signup/:token — account, club and first team; the answer signs in. */
export function useCompleteSignup(token: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SignupComplete) => apiPost<{ teamId: string; clubId: string }>(`/signup/${encodeURIComponent(token)}`, body),
    meta: { toast: false, authRedirect: false },
    onSuccess: async () => {
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== meKey[0] });
      await qc.fetchQuery({ ...meQueryOptions(), staleTime: 0 });
    },
  });
}
