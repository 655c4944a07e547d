import { useMutation } from "@tanstack/react-query";
import { apiPost } from "@/lib/api";

/** POST /api/auth/reset-password */
export const resetPassword = (input: { newPassword: string; token: string }) => apiPost<unknown>("/auth/reset-password", input);

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword, meta: { toast: false, authRedirect: false } });
}
