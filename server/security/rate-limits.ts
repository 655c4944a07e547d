// Per-address limits on the routes a stranger could hammer: signing in, sending invitations and
// starting uploads. Each answers 429 problem+json with a RateLimit header (IETF draft 8) that
// says when to try again. Counted in PostgreSQL (rate-limit-store.ts), so several web processes
// share one count per address.
import type { Express, RequestHandler } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { sendProblem } from "../http/problem";
import { PostgresRateLimitStore } from "./rate-limit-store";

export const RATE_LIMITS = {
  /** Sign-in attempts per client address per minute, whichever accounts they name. */
  signIn: 10,
  /** Failed sign-ins per account from one client address per 15 minutes. Counted per pair, so a
   * stranger guessing a password never locks the owner (another address) out of the account. */
  signInFailuresPerAccount: 5,
  /** Password-reset requests and resets per client address per minute. */
  passwordReset: 5,
  /** Invitations sent, re-sent or cancelled per address per minute. */
  invitations: 30,
  /** Sign-up links asked for per address per minute (each sends a mail). */
  signups: 5,
  /** Uploads started per address per minute (a resumable upload's chunks are not counted). */
  uploads: 60,
} as const;

function limiter(name: string, limit: number, what: string, enabled: boolean, o: Partial<Parameters<typeof rateLimit>[0]> = {}): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit,
    store: new PostgresRateLimitStore(name),
    // The database away must not lock everyone out of signing in: the request goes on to the
    // route, which answers 503 by itself when it needs the database.
    passOnStoreError: true,
    ...o,
    standardHeaders: "draft-8",
    // A forwarded header from a client we do not trust is ignored on purpose (TRUST_PROXY unset).
    validate: { xForwardedForHeader: false },
    legacyHeaders: false,
    skip: () => !enabled,
    handler: (_req, res) => sendProblem(res, 429, "rate_limited", `Too many ${what} from this address. Wait a minute and try again.`),
  });
}

const writesOnly = (h: RequestHandler): RequestHandler => (req, res, next) => (req.method === "GET" || req.method === "HEAD" ? next() : h(req, res, next));
const postsOnly = (h: RequestHandler): RequestHandler => (req, res, next) => (req.method === "POST" ? h(req, res, next) : next());

/**
 * Failed sign-ins per (account, client address): mount after the auth route guard, which has
 * parsed and checked the body. A correct password does not count (skipSuccessfulRequests).
 */
export function signInFailureLimit(enabled: boolean): RequestHandler {
  return limiter("sign-in-failures", RATE_LIMITS.signInFailuresPerAccount, "failed sign-ins for this account", enabled, {
    windowMs: 15 * 60_000,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `${String((req.body as { email?: unknown } | undefined)?.email ?? "")}|${ipKeyGenerator(req.ip ?? "")}`,
    handler: (_req, res) =>
      sendProblem(res, 429, "rate_limited", "Too many wrong passwords for this account from this address. Wait 15 minutes, or reset the password."),
  });
}

/** Mount before the routes they guard (before better-auth's handler and the upload endpoint). */
export function applyRateLimits(app: Express, enabled: boolean) {
  // Every limit keys on req.ip: the connecting address, or the forwarded one only when
  // TRUST_PROXY names the proxy in front (decision 112).
  app.use("/api/auth/sign-in", limiter("sign-in", RATE_LIMITS.signIn, "sign-in attempts", enabled));
  app.use(["/api/auth/request-password-reset", "/api/auth/reset-password"], postsOnly(limiter("password-reset", RATE_LIMITS.passwordReset, "password-reset requests", enabled)));
  app.use("/api/teams/:teamId/invitations", writesOnly(limiter("invitations", RATE_LIMITS.invitations, "invitation changes", enabled)));
  app.use("/api/signup", postsOnly(limiter("signups", RATE_LIMITS.signups, "sign-up requests", enabled)));
  // tus: POST creates an upload; its PATCH chunks and HEAD resumes are not counted.
  app.use("/api/uploads", postsOnly(limiter("uploads", RATE_LIMITS.uploads, "uploads", enabled)));
}
