// The one place a club's read-only state (payment overdue past its grace, access.ts)
// is enforced: every write to a team — its API under /api/teams/:teamId and new uploads — passes
// through this middleware, mounted once in app.ts. Reads always pass; the team's billing routes pass
// (paying must stay possible); nothing is ever deleted for non-payment.
import type { NextFunction, Request, Response } from "express";
import { Metadata } from "@tus/server";
import { readSession, roleIn } from "../auth/context";
import { env } from "../env";
import { sendProblem } from "../http/problem";
import { SAFE_METHODS } from "../http/safe-methods";
import { accessOf } from "./access";
import { clubOfTeam } from "../entities/club/repository";

const TEAM_PATH = /^\/api\/teams\/([^/]+)(\/.*)?$/;

/** The team a write goes to, or null when it goes to no team (or to the team's billing). */
export function teamOfWrite(req: Pick<Request, "method" | "path" | "get">): string | null {
  if (SAFE_METHODS.has(req.method)) return null;
  const m = TEAM_PATH.exec(req.path);
  if (m) return (m[2] ?? "").startsWith("/billing") ? null : decodeURIComponent(m[1]!);
  if (req.path === "/api/uploads" && req.method === "POST") {
    try {
      return Metadata.parse(req.get("upload-metadata") ?? undefined).teamId ?? null;
    } catch {
      return null; // the upload endpoint answers malformed metadata itself
    }
  }
  return null;
}

/** Answers 402 to a member's write to an unpaid club's team; everything else goes on (`next`). */
export function refuseWritesWhenUnpaid(): (req: Request, res: Response, next: NextFunction) => Promise<void> {
  return async (req, res, next) => {
    const teamId = teamOfWrite(req);
    if (!teamId) return next();
    const club = await clubOfTeam(teamId);
    if (!club || accessOf(club, new Date(), env().BILLING_GRACE_DAYS) !== "read_only") return next();
    // Only members learn why; anyone else gets the route's own 401/404.
    const s = await readSession(req);
    if (!s || !(await roleIn(s.user.id, teamId))) return next();
    req.log.info({ teamId, clubId: club.id }, "write refused: club read-only for non-payment");
    sendProblem(res, 402, "read_only_unpaid",
      `${club.name}'s payment is overdue, so its teams are read-only: everything can still be seen and nothing was deleted. `
      + "A team admin can pay the open invoice under Billing to restore them at once.");
  };
}
