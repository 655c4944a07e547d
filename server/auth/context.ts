import type { NextFunction, Request, Response } from "express";
import { fromNodeHeaders } from "better-auth/node";
import { and, eq, sql } from "drizzle-orm";
import { auth } from "./auth";
import { db } from "../db/client";
import { member } from "../db/schema";
import { prepared } from "../db/prepared";
import { HttpError, notFound, unauthenticated } from "../http/problem";
import { RoleSchema } from "../../shared/schemas/roster";
import type { Actor } from "./policy";

export interface SignedIn {
  user: { id: string; name: string; email: string };
  sessionId: string;
  activeTeamId: string | null;
}

declare global {
  namespace Express {
    interface Request {
      signedIn?: SignedIn;
      actor?: Actor;
    }
  }
}

export async function readSession(req: Request): Promise<SignedIn | null> {
  const s = await auth().api.getSession({ headers: fromNodeHeaders(req.headers) });
  if (!s) return null;
  return {
    user: { id: s.user.id, name: s.user.name, email: s.user.email },
    sessionId: s.session.id,
    activeTeamId: (s.session as { activeOrganizationId?: string | null }).activeOrganizationId ?? null,
  };
}

export async function requireUser(req: Request, _res: Response, next: NextFunction) {
  const s = await readSession(req);
  if (!s) throw unauthenticated();
  req.signedIn = s;
  next();
}

// Asked on every team request (docs/decisions/106-hot-path-queries.md).
const roleQuery = prepared("role_in", (name) =>
  db().select({ role: member.role }).from(member).where(and(eq(member.userId, sql.placeholder("userId")), eq(member.organizationId, sql.placeholder("teamId")))).prepare(name),
);

/** Role of a user in a team, or null when not a member (callers answer 404: nothing leaks). */
export async function roleIn(userId: string, teamId: string) {
  const [row] = await roleQuery().execute({ userId, teamId });
  if (!row) return null;
  const parsed = RoleSchema.safeParse(row.role.split(",")[0]?.trim());
  return parsed.success ? parsed.data : null;
}

/** For routers mounted at /api/teams/:teamId — sets req.actor or answers 401/404. */
export async function requireTeamMember(req: Request, _res: Response, next: NextFunction) {
  const s = req.signedIn ?? (await readSession(req));
  if (!s) throw unauthenticated();
  req.signedIn = s;
  const teamId = String(req.params.teamId ?? "");
  const role = await roleIn(s.user.id, teamId);
  if (!role) throw notFound("That team");
  req.actor = { userId: s.user.id, teamId, role };
  next();
}

export function actorOf(req: Request): Actor {
  if (!req.actor) throw new HttpError(500, "internal", "Team context missing");
  return req.actor;
}

export function signedInOf(req: Request): SignedIn {
  if (!req.signedIn) throw unauthenticated();
  return req.signedIn;
}

export const headersOf = (req: Request) => fromNodeHeaders(req.headers);
