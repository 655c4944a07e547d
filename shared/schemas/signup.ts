import { z } from "zod";
import { EmailSchema, PasswordSchema, PersonNameSchema } from "./roster";
import { humanText } from "./text";

export const SignupStartSchema = z.object({ email: EmailSchema });

export const SignupCompleteSchema = z.object({
  name: PersonNameSchema,
  password: PasswordSchema,
  clubName: humanText({ field: "The club's name", max: 80, min: 2, minMessage: "Give the club a name of at least 2 characters" }),
  teamName: humanText({ field: "The team's name", max: 80, min: 2, minMessage: "Give the team a name of at least 2 characters" }),
});
export type SignupComplete = z.infer<typeof SignupCompleteSchema>;
