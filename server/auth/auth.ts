import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { organization } from "better-auth/plugins";
import { ac, roles } from "./roles";
import { db } from "../db/client";
import * as schema from "../db/schema";
import { env } from "../env";
import { sendMail } from "../mail/mailer";
import { inviteMail, resetPasswordMail } from "../mail/templates";

const INVITATION_TTL_S = 7 * 24 * 3600;
/** How long a signed-out or revoked session can still be honoured by another browser tab or device. */
export const SESSION_CACHE_S = 60;

function makeAuth() {
  const e = env();
  return betterAuth({
    baseURL: e.PUBLIC_URL,
    basePath: "/api/auth",
    secret: e.AUTH_SECRET,
    database: drizzleAdapter(db(), { provider: "pg", schema }),
    trustedOrigins: [e.PUBLIC_URL, "http://127.0.0.1:3000", "http://localhost:3000", "http://127.0.0.1:5173", "http://localhost:5173"],
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 10,
      resetPasswordTokenExpiresIn: 3600,
      sendResetPassword: async ({ user, url }) => {
        await sendMail(resetPasswordMail({ to: user.email, name: user.name, url }));
      },
    },
    // A signed, short-lived copy of the session in a cookie spares a database read on every
    // request (docs/decisions/105-session-cookie-cache.md). Team membership is still read each time.
    session: { expiresIn: 14 * 24 * 3600, updateAge: 24 * 3600, cookieCache: { enabled: true, maxAge: SESSION_CACHE_S } },
    advanced: {
      useSecureCookies: e.PUBLIC_URL.startsWith("https://"),
      defaultCookieAttributes: { httpOnly: true, sameSite: "lax" },
    },
    rateLimit: {
      enabled: e.RATE_LIMIT,
      storage: "memory",
      window: 60,
      max: 200,
      customRules: {
        "/sign-in/email": { window: 60, max: 10 },
        "/request-password-reset": { window: 60, max: 5 },
      },
    },
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
