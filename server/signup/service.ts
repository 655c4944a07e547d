// A new club signs up. The e-mail is proven first: the address gets a one-time link (24 h), and
// only the holder of that link can create the account, the club and its first team, becoming its
// team admin on the free plan. The answer to "send me a link" never tells whether the address
// already has an account (that address gets a "sign in instead" mail).
import { createHash, randomBytes } from "node:crypto";
import { auth } from "../auth/auth";
import { env } from "../env";
import { log } from "../log";
import { HttpError, notFound } from "../http/problem";
import { mergeSetCookies, viaAuth } from "../http/better-auth-errors";
import { sendMail } from "../mail/mailer";
import { createAccount } from "../auth/accounts";
import { deleteUser, userIdByEmail } from "../entities/user/account";
import { signupExistingMail, signupMail } from "../mail/templates";
import { createClubWithTeam } from "../billing/clubs";
import type { SignupComplete } from "../../shared/schemas/signup";
import * as repo from "../entities/user/signup-requests";

export const SIGNUP_LINK_TTL_MS = 24 * 3600_000;
/** Links sent to one address per hour; further requests are answered alike and send nothing. */
const MAX_LINKS_PER_HOUR = 3;

const hashOf = (token: string) => createHash("sha256").update(token).digest("hex");

export async function requestSignup(email: string) {
  const e = env();
  if ((await repo.recentRequests(email)) >= MAX_LINKS_PER_HOUR) {
    log.warn({ email }, "sign-up link not sent: too many for this address this hour");
    return;
  }
  const token = randomBytes(32).toString("base64url");
  await repo.createRequest(email, hashOf(token), new Date(Date.now() + SIGNUP_LINK_TTL_MS));
  const mail = (await userIdByEmail(email))
    ? signupExistingMail({ to: email, url: `${e.PUBLIC_URL}/sign-in` })
    : signupMail({ to: email, url: `${e.PUBLIC_URL}/sign-up/${token}` });
  await sendMail(mail);
}

async function openRequest(token: string) {
  const r = await repo.requestByHash(hashOf(token));
  if (!r) throw notFound("That sign-up link");
  if (r.usedAt) throw new HttpError(410, "signup_link_used", "This link has already been used. Sign in instead.");
  if (r.expiresAt.getTime() < Date.now()) throw new HttpError(410, "signup_link_expired", "This link has expired. Ask for a new one on the sign-up page.");
  return r;
}

export async function signupLink(token: string) {
  const r = await openRequest(token);
  return { email: r.email };
}

/** Creates the verified account, the club and its first team; returns the cookies that sign in. */
export async function completeSignup(token: string, body: SignupComplete) {
  const r = await openRequest(token);
  if (await userIdByEmail(r.email)) throw new HttpError(409, "account_exists", `An account for ${r.email} exists. Sign in instead.`);
  // The link proved the address: the account starts verified (the one door, server/auth/accounts.ts).
  const { userId, setCookies } = await createAccount({ email: r.email, name: body.name, password: body.password, emailVerified: true, signIn: true });
  if (!(await repo.consumeRequest(r.id))) {
    await deleteUser(userId); // the other request that used the link keeps the address
    throw new HttpError(410, "signup_link_used", "This link has already been used. Sign in instead.");
  }
  const { club, team } = await createClubWithTeam({ clubName: body.clubName, teamName: body.teamName, adminId: userId });
  const authHeaders = new Headers({ cookie: setCookies.map((c) => c.split(";")[0]).join("; ") });
  const { headers: active } = await viaAuth(() => auth().api.setActiveOrganization({ headers: authHeaders, body: { organizationId: team.id }, returnHeaders: true }));
  log.info({ clubId: club.id, teamId: team.id, userId }, "new club signed up");
  return { teamId: team.id, clubId: club.id, setCookies: mergeSetCookies(setCookies, active.getSetCookie()) };
}
