import { useMutation } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";
import type { ForgotInput } from "../schemas";

/** POST /api/auth/request-password-reset — mails a link to /reset-password?token=… if the account exists. */
export const requestPasswordReset = ({ email }: ForgotInput) =>
  apiPost<unknown>("/auth/request-password-reset", { email, redirectTo: "/reset-password" });

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset, meta: { toast: false, authRedirect: false } });
}
