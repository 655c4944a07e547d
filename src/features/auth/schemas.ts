import { z } from "zod";
import { PasswordSchema } from "@shared/schemas/roster";
import { SignupCompleteSchema } from "@shared/schemas/signup";

// Client-side checks for the sign-in forms; the server checks again and its messages win.
// The server's own password rule (shared) so the hint and the check match what it will accept.
export const PASSWORD_MIN = 10;

const email = z.string().trim().min(1, "Enter your e-mail address").email("Enter a valid e-mail address, like name@club.org");

export const signInSchema = z.object({ email, password: z.string().min(1, "Enter your password") });
export type SignInInput = z.infer<typeof signInSchema>;

export const forgotSchema = z.object({ email });
export type ForgotInput = z.infer<typeof forgotSchema>;

const newPassword = PasswordSchema;

export const resetSchema = z
  .object({ newPassword, confirm: z.string() })
  .refine((v) => v.newPassword === v.confirm, { path: ["confirm"], message: "The two passwords don't match" });
export type ResetInput = z.infer<typeof resetSchema>;

export const signupDetailsSchema = SignupCompleteSchema.extend({ confirm: z.string() }).refine((v) => v.password === v.confirm, {
  path: ["confirm"],
  message: "The two passwords don't match",
});
export type SignupDetailsInput = z.infer<typeof signupDetailsSchema>;

export const acceptSchema = z
  .object({ name: z.string().trim().min(1, "Enter your name as your team will see it").max(100, "Keep it under 100 characters"), password: newPassword, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords don't match" });
export type AcceptInput = z.infer<typeof acceptSchema>;
