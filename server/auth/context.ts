import type { NextFunction, Request, Response } from "express";
import { fromNodeHeaders } from "better-auth/node";
import { auth } from "./auth";
import type { z } from "zod";
import { HttpError, notFound, unauthenticated, zodToHttp } from "../http/problem";
import { SAFE_METHODS } from "../http/safe-methods";
import { LRUCache } from "lru-cache";
import { roleIn } from "../entities/member/repository";
import { parseRole, type Role } from "../entities/member/role";
import type { Actor } from "./policy";
import { CLIENT_ADDRESS_HEADER } from "./http-routes";
import { sessionMemo } from "./session-memo";

export { roleIn };

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

/**
 * The signed-in person, or null. Reads trust better-auth's signed 60 s cookie copy of the session
 * (docs/decisions/105); a write asks the database, so a session that was signed out, revoked by a
 * password reset or removed can never change anything, even from a copied cookie.
 */
export async function readSession(req: Request): Promise<SignedIn | null> {
  const read = SAFE_METHODS.has(req.method);
  // Verifying the signed cookie through better-auth was the largest CPU cost of a read
  // (decision 174): a read reuses the answer for the same Cookie header for a few seconds.
  const memo = read ? recent.get(req.headers.cookie) : undefined;
  if (memo) return memo;
  const s = await auth().api.getSession({ headers: headersOf(req), query: { disableCookieCache: !read } });
  if (!s) return null;
  const signedIn = {
    user: { id: s.user.id, name: s.user.name, email: s.user.email },
    sessionId: s.session.id,
    activeTeamId: (s.session as { activeOrganizationId?: string | null }).activeOrganizationId ?? null,
  };
  // A write asked the database: its answer is as fresh as a read needs.
  recent.set(req.headers.cookie, signedIn);
  return signedIn;
}
const recent = sessionMemo<SignedIn>();

/** The signed-in person, read once per request; 401 when signed out. */
async function signedInOr401(req: Request): Promise<SignedIn> {
  const s = req.signedIn ?? (await readSession(req));
  if (!s) throw unauthenticated();
  req.signedIn = s;
  return s;
}

export async function requireUser(req: Request, _res: Response, next: NextFunction) {
  await signedInOr401(req);
  next();
}


/** For routers mounted at /api/teams/:teamId — sets req.actor or answers 401/404. */
export async function requireTeamMember(req: Request, _res: Response, next: NextFunction) {
  const s = await signedInOr401(req);
  const teamId = String(req.params.teamId ?? "");
  const role = await roleIn(s.user.id, teamId);
  if (!role) throw notFound("That team");
  req.actor = { userId: s.user.id, teamId, role };
  next();
}

/**
 * A team read that checks membership in its own statement (decision 195): `storedRole` is the
 * caller's stored role as that statement read it (undefined when it read none, e.g. no row: the
 * role is then asked on its own), and `answer` makes the answer, called only once that role is
 * known to be the one the read ran as.
 */
export interface ReadWithRole<T> {
  storedRole?: string | null;
  answer: () => T | Promise<T>;
}

// The role this process last saw for a (person, team): only a guess at which role a read runs as,
// held to the stored role by the read's own statement every time.
const lastRoles = new LRUCache<string, Role>({ max: 10_000 });

/**
 * In place of requireTeamMember for the hot team reads (decision 195): the same 401 when signed
 * out and 404 "That team" for a non-member, with the role read by the read's own statement
 * instead of a query before it. The read runs as the role last seen for the caller in this team
 * (with none, the role is asked first, as requireTeamMember does); when its statement finds
 * another stored role, the read runs again as that role. No answer is made for a role the caller
 * does not hold at the moment of the read.
 */
export async function readAsTeamMember<T>(req: Request, read: (a: Actor) => Promise<ReadWithRole<T>>): Promise<T> {
  const s = await signedInOr401(req);
  const teamId = String(req.params.teamId ?? "");
  const key = `${s.user.id}\u0000${teamId}`;
  let role = lastRoles.get(key) ?? (await roleIn(s.user.id, teamId));
  for (let tries = 0; role && tries < 3; tries++) {
    const a: Actor = { userId: s.user.id, teamId, role };
    const r = await read(a);
    const stored = r.storedRole === undefined ? await roleIn(s.user.id, teamId) : parseRole(r.storedRole);
    if (stored === role) {
      lastRoles.set(key, role);
      req.actor = a;
      return r.answer();
    }
    role = stored;
  }
  lastRoles.delete(key);
  if (role) throw new HttpError(503, "busy", "Your role in this team changed while this page was read. Try again.");
  throw notFound("That team");
}

/**
 * readAsTeamMember for a read whose query string `schema` checks: a bad query is refused (422)
 * only once the caller is known to be a member, as on every team route (a non-member gets 404).
 */
export function readQueryAsTeamMember<S extends z.ZodType, T>(req: Request, schema: S, read: (a: Actor, q: z.output<S>) => Promise<ReadWithRole<T>>): Promise<T> {
  const q = schema.safeParse(req.query);
  return readAsTeamMember(req, async (a) =>
    q.success
      ? read(a, q.data)
      : {
          answer: (): never => {
            throw zodToHttp(q.error);
          },
        },
  );
}

export function actorOf(req: Request): Actor {
  if (!req.actor) throw new HttpError(500, "internal", "Team context missing");
  return req.actor;
}

export function signedInOf(req: Request): SignedIn {
  if (!req.signedIn) throw unauthenticated();
  return req.signedIn;
}

/** Request headers for a server-side better-auth call, with the client's address as we resolved it. */
export function headersOf(req: Request): Headers {
  const h = fromNodeHeaders(req.headers);
  h.set(CLIENT_ADDRESS_HEADER, req.ip ?? "");
  return h;
}
