import { z } from "zod";

export const SignupStartSchema = z.object({ email: z.string().trim().toLowerCase().email("Enter a valid e-mail address").max(254) });

export const SignupCompleteSchema = z.object({
  name: z.string().trim().min(1, "Enter your name").max(100),
  password: z.string().min(10, "Use at least 10 characters").max(128),
  clubName: z.string().trim().min(2, "Give the club a name of at least 2 characters").max(80),
  teamName: z.string().trim().min(2, "Give the team a name of at least 2 characters").max(80),
});
export type SignupComplete = z.infer<typeof SignupCompleteSchema>;
