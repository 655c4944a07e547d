// The one door through which an account comes to exist. better-auth's open e-mail sign-up is
// closed to everyone: its HTTP route is not exposed (http-routes.ts), and a server-side call is
// refused by the hook in auth.ts unless it runs inside createAccount. A product flow that may
// create accounts (accepting an invitation today; a new club's own sign-up, with its e-mail
// verified before anything else, later) calls createAccount and says whether the flow has proved
// the address (docs/decisions/110-accounts-only-through-product-flows.md).
import { auth } from "./auth";
import { viaAuth } from "../http/better-auth-errors";
import { parse } from "../http/validate";
import { EmailSchema, PasswordSchema, PersonNameSchema } from "../../shared/schemas/roster";
import { z } from "zod";
import { deleteSessionsOf, markEmailVerified } from "../entities/user/account";
import { runAsProductSignUp } from "./sign-up-gate";

const NewAccountSchema = z.object({ email: EmailSchema, name: PersonNameSchema, password: PasswordSchema });

export interface NewAccount {
  email: string;
  name: string;
  password: string;
  /** The flow proved the person holds the address (a link mailed to it was opened). */
  emailVerified: boolean;
  /** Keep the new session and return its cookies; otherwise no session is left behind. */
  signIn: boolean;
}

/** Creates the account; answers 422 naming the field for a bad e-mail, name or password. */
export async function createAccount(a: NewAccount): Promise<{ userId: string; setCookies: string[] }> {
  const body = parse(NewAccountSchema, { email: a.email, name: a.name, password: a.password });
  const r = await runAsProductSignUp(() => viaAuth(() => auth().api.signUpEmail({ body, returnHeaders: true })));
  const userId = r.response.user.id;
  if (a.emailVerified) await markEmailVerified(userId);
  if (!a.signIn) await deleteSessionsOf(userId);
  return { userId, setCookies: a.signIn ? r.headers.getSetCookie() : [] };
}
