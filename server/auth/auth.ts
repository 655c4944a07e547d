import { betterAuth } from "better-auth";
import { APIError } from "better-auth/api";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { organization } from "better-auth/plugins";
import { ac, roles } from "./roles";
import { db } from "../db/client";
import * as schema from "../db/schema";
import { env } from "../env";
import { sendMail } from "../mail/mailer";
import { inviteMail, resetPasswordMail } from "../mail/templates";
import { unsafeTextProblem, TEXT_LIMITS } from "../../shared/schemas/text";
import { CLIENT_ADDRESS_HEADER } from "./http-routes";
import { claimUnverifiedAccount } from "../entities/user/account";
import { isProductSignUp } from "./sign-up-gate";
import { SESSION_MEMO_S } from "./session-memo";

const INVITATION_TTL_S = 7 * 24 * 3600;
/** How long a signed-out or revoked session can still be honoured by another browser tab or device. */
export const SESSION_CACHE_S = 60;
// …of which the last SESSION_MEMO_S are a process's own memo of a verified Cookie header (174).

/** Origins allowed to send writes: the public address, plus the local ones while developing. */
export function trustedOriginsFor(e: { PUBLIC_URL: string; NODE_ENV: string }): string[] {
  const dev = ["http://127.0.0.1:3000", "http://localhost:3000", "http://127.0.0.1:5173", "http://localhost:5173"];
  return e.NODE_ENV === "production" ? [new URL(e.PUBLIC_URL).origin] : [...new Set([new URL(e.PUBLIC_URL).origin, ...dev])];
}

/** Whatever route of the library writes a user, the name obeys the same rules as everywhere. */
function checkName(name: unknown) {
  if (name === undefined) return;
  const problem = typeof name !== "string" ? "must be text" : name.trim().length > TEXT_LIMITS.name ? `can be at most ${TEXT_LIMITS.name} characters` : unsafeTextProblem(name);
  if (problem) throw new APIError("UNPROCESSABLE_ENTITY", { code: "VALIDATION_FAILED", message: `Name ${problem}` });
}

function makeAuth() {
  const e = env();
  return betterAuth({
    baseURL: e.PUBLIC_URL,
    basePath: "/api/auth",
    secret: e.AUTH_SECRET,
    database: drizzleAdapter(db(), { provider: "pg", schema }),
    trustedOrigins: trustedOriginsFor(e),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      resetPasswordTokenExpiresIn: 3600,
      // The mail names nobody: the account's name may be whatever its maker typed.
      sendResetPassword: async ({ user, url }) => {
        await sendMail(resetPasswordMail({ to: user.email, url }));
      },
      // A reset proves the address: every session of the account ends (the stranger who made it
      // or stole a cookie is out), and an account nobody had proved is claimed by its owner.
      revokeSessionsOnPasswordReset: true,
      onPasswordReset: async ({ user }) => {
        if (!user.emailVerified) await claimUnverifiedAccount(user.id, user.email);
      },
    },
    databaseHooks: {
      user: {
        create: {
          before: async (u) => {
            // Accounts come only through server/auth/accounts.ts (docs/decisions/110).
            if (!isProductSignUp()) throw new APIError("FORBIDDEN", { code: "SIGN_UP_CLOSED", message: "Accounts are created by invitation only." });
            checkName(u.name);
          },
        },
        update: { before: async (u) => void checkName(u.name) },
      },
    },
    // A signed, short-lived copy of the session in a cookie spares a database read on every
    // request (docs/decisions/105-session-cookie-cache.md). Team membership is still read each time.
    session: { expiresIn: 14 * 24 * 3600, updateAge: 24 * 3600, cookieCache: { enabled: true, maxAge: SESSION_CACHE_S - SESSION_MEMO_S } },
    advanced: {
      // The client's address as our trust-proxy setting resolved it (http-routes.ts), never a
      // forwarded header taken from whoever sent the request.
      ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
      useSecureCookies: e.PUBLIC_URL.startsWith("https://"),
      defaultCookieAttributes: { httpOnly: true, sameSite: "lax" },
    },
    // Our limiters (server/security/rate-limits.ts) count per client address as TRUST_PROXY
    // resolves it; the library's own would read X-Forwarded-For from anyone.
    rateLimit: { enabled: false },
    plugins: [
      organization({
        ac,
        roles,
        creatorRole: "admin",
        allowUserToCreateOrganization: false,
        invitationExpiresIn: INVITATION_TTL_S,
        cancelPendingInvitationsOnReInvite: true,
        sendInvitationEmail: async (data) => {
          await sendMail(
            inviteMail({
              to: data.email,
              teamName: data.organization.name,
              inviterName: data.inviter.user.name,
              role: String(data.role),
              url: `${e.PUBLIC_URL}/invite/${data.id}`,
            }),
          );
        },
      }),
    ],
  });
}

export type Auth = ReturnType<typeof makeAuth>;
let cached: Auth | undefined;
export function auth(): Auth {
  cached ??= makeAuth();
  return cached;
}
