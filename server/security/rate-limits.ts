// Per-address limits on the routes a stranger could hammer: signing in, sending invitations and
// starting uploads. Each answers 429 problem+json with a RateLimit header (IETF draft 8) that
// says when to try again. Memory-backed: with several web processes each counts on its own,
// which bounds one address to N × the limit — enough against guessing passwords.
import type { Express, RequestHandler } from "express";
import { rateLimit } from "express-rate-limit";
import { sendProblem } from "../http/problem";

export const RATE_LIMITS = {
  /** Sign-in attempts per address per minute (better-auth adds its own limit on top). */
  signIn: 10,
  /** Invitations sent, re-sent or cancelled per address per minute. */
  invitations: 30,
  /** Sign-up links asked for per address per minute (each sends a mail). */
  signups: 5,
  /** Uploads started per address per minute (a resumable upload's chunks are not counted). */
  uploads: 60,
} as const;

function limiter(limit: number, what: string, enabled: boolean): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    skip: () => !enabled,
    handler: (_req, res) => sendProblem(res, 429, "rate_limited", `Too many ${what} from this address. Wait a minute and try again.`),
  });
}

const writesOnly = (h: RequestHandler): RequestHandler => (req, res, next) => (req.method === "GET" || req.method === "HEAD" ? next() : h(req, res, next));
const postsOnly = (h: RequestHandler): RequestHandler => (req, res, next) => (req.method === "POST" ? h(req, res, next) : next());

/** Mount before the routes they guard (before better-auth's handler and the upload endpoint). */
export function applyRateLimits(app: Express, enabled: boolean) {
  app.use("/api/auth/sign-in", limiter(RATE_LIMITS.signIn, "sign-in attempts", enabled));
  app.use("/api/teams/:teamId/invitations", writesOnly(limiter(RATE_LIMITS.invitations, "invitation changes", enabled)));
  app.use("/api/signup", postsOnly(limiter(RATE_LIMITS.signups, "sign-up requests", enabled)));
  // tus: POST creates an upload; its PATCH chunks and HEAD resumes are not counted.
  app.use("/api/uploads", postsOnly(limiter(RATE_LIMITS.uploads, "uploads", enabled)));
}
