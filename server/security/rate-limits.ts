// Per-address limits on the routes a stranger could hammer: signing in, sending invitations and
// starting uploads. Each answers 429 problem+json with a RateLimit header (IETF draft 8) that
// says when to try again. Counted in PostgreSQL (rate-limit-store.ts), so several web processes
// share one count per address.
import type { RequestHandler } from "express";
import { ipKeyGenerator, rateLimit } from "express-rate-limit";
import { match } from "path-to-regexp";
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

function limiter(name: string, limit: number, what: string, enabled = true, o: Partial<Parameters<typeof rateLimit>[0]> = {}): RequestHandler {
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

/** Which requests a limit counts: any method, writes (all but GET and HEAD), or POST only. */
type Counted = "all" | "writes" | "posts";
const counts: Record<Counted, (method: string) => boolean> = {
  all: () => true,
  writes: (m) => m !== "GET" && m !== "HEAD",
  posts: (m) => m === "POST",
};

/**
 * The limited routes, as Express paths (a limit covers the path and everything under it, like
 * `app.use(path)`). Every limit keys on req.ip: the connecting address, or the forwarded one only
 * when TRUST_PROXY names the proxy in front (decision 112).
 */
export const LIMITED_ROUTES = [
  { paths: ["/api/auth/sign-in"], counted: "all", name: "sign-in", limit: RATE_LIMITS.signIn, what: "sign-in attempts" },
  { paths: ["/api/auth/request-password-reset", "/api/auth/reset-password"], counted: "posts", name: "password-reset", limit: RATE_LIMITS.passwordReset, what: "password-reset requests" },
  { paths: ["/api/teams/:teamId/invitations"], counted: "writes", name: "invitations", limit: RATE_LIMITS.invitations, what: "invitation changes" },
  { paths: ["/api/signup"], counted: "posts", name: "signups", limit: RATE_LIMITS.signups, what: "sign-up requests" },
  // tus: POST creates an upload; its PATCH chunks and HEAD resumes are not counted.
  { paths: ["/api/uploads"], counted: "posts", name: "uploads", limit: RATE_LIMITS.uploads, what: "uploads" },
] as const satisfies readonly { paths: readonly string[]; counted: Counted; name: string; limit: number; what: string }[];

/**
 * An Express mount path as a test of a request's path, by path-to-regexp, the matcher Express's
 * router itself uses for `app.use(path)`: letters in any case, a `:param` one segment, the path
 * itself or anything under it. Not decoded: a path Express cannot decode is still counted.
 * (tests/unit/security/rate-limit-routes.test.ts holds it to Express's own router.)
 */
const mountPathTest = (path: string) => match(path, { end: false, sensitive: false, decode: false });
const routeTests = LIMITED_ROUTES.map((r) => ({ route: r, counts: counts[r.counted], tests: r.paths.map(mountPathTest) }));

/** The limited route that counts a request with this method and path (`req.path`), if any. */
export function limitedRouteOf(method: string, path: string): (typeof LIMITED_ROUTES)[number] | undefined {
  for (const r of routeTests) if (r.counts(method) && r.tests.some((t) => t(path) !== false)) return r.route;
  return undefined;
}

/**
 * The limiter, if any, that counts this request: found by its method and path in one pass instead
 * of one router layer per limit on every request (decision 196). Call before the routes they guard
 * (better-auth's handler, the upload endpoint); app.ts does so through `everyRequest`.
 */
export function rateLimitFor(enabled: boolean): (method: string, path: string) => RequestHandler | undefined {
  // RATE_LIMIT=false: no limiter at all (each would skip the request anyway).
  if (!enabled) return () => undefined;
  const limiters = new Map(LIMITED_ROUTES.map((r) => [r, limiter(r.name, r.limit, r.what)]));
  return (method, path) => {
    const r = limitedRouteOf(method, path);
    return r && limiters.get(r);
  };
}
