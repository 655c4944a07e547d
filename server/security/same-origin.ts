// Cross-site request forgery guard for every state-changing /api route. better-auth checks the
// Origin of its own routes (/api/auth/*) only when a cookie is sent, and not at all under
// NODE_ENV=test; the rest of the API relies on the session cookie, whose SameSite=Lax still lets
// a sibling subdomain ("same site") or an old browser send it along. So this guard covers all of
// /api, better-auth's routes included. Browsers tell us where a request comes from; a write is
// refused when:
//   - Sec-Fetch-Site says it comes from another origin that is not one of our trusted origins, or
//   - without Sec-Fetch-Site, the Origin header names another host than the one asked.
// A request with neither header is not from a current browser (scripts, curl) and carries no
// ambient cookie risk worth refusing. The order of checks follows the Fetch Metadata guidance
// (OWASP CSRF Prevention Cheat Sheet, "Fetch Metadata headers" and "Verifying origin with
// standard headers") [M].
import type { Request, Response } from "express";
import { sendProblem } from "../http/problem";
import { SAFE_METHODS } from "../http/safe-methods";


const originOf = (url: string) => {
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
};

export type OriginVerdict = "allow" | "refuse";

/** The decision alone (pure), for the table test. */
export function judgeWrite(h: { method: string; secFetchSite?: string; origin?: string; host?: string; protocol: string }, trusted: ReadonlySet<string>): OriginVerdict {
  if (SAFE_METHODS.has(h.method.toUpperCase())) return "allow";
  const origin = h.origin && h.origin !== "null" ? originOf(h.origin) : h.origin === "null" ? "null" : undefined;
  if (origin && origin !== "null" && trusted.has(origin)) return "allow";
  const site = h.secFetchSite?.toLowerCase();
  if (site) return site === "same-origin" || site === "none" ? "allow" : "refuse";
  if (origin === undefined) return "allow";
  if (origin === "null" || !h.host) return "refuse";
  return origin === `${h.protocol}://${h.host}` ? "allow" : "refuse";
}

/**
 * Refuses a cross-site write with 403 problem+json `cross_site_request`; true when it answered.
 * Reads pass at once. Called for every /api request by `everyRequest` (decision 196).
 */
export function refuseCrossSiteWrite(trustedOrigins: () => readonly string[]): (req: Request, res: Response) => boolean {
  let trusted: Set<string> | undefined;
  return (req, res) => {
    if (SAFE_METHODS.has(req.method)) return false;
    trusted ??= new Set(trustedOrigins().map(originOf).filter((o): o is string => o !== null));
    const verdict = judgeWrite(
      { method: req.method, secFetchSite: req.get("sec-fetch-site"), origin: req.get("origin"), host: req.get("host"), protocol: req.protocol },
      trusted,
    );
    if (verdict === "allow") return false;
    req.log?.warn({ origin: req.get("origin"), secFetchSite: req.get("sec-fetch-site"), path: req.path }, "cross-site write refused");
    sendProblem(res, 403, "cross_site_request", "This request came from another website and was refused. Open Loadframe itself and try again.");
    return true;
  };
}
