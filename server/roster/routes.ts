import { Router } from "express";
import { actorOf, headersOf, readSession } from "../auth/context";
import { parse } from "../http/validate";
import { AcceptInvitationBodySchema, InviteBodySchema, RoleChangeBodySchema } from "../../shared/schemas/roster";
import * as svc from "./service";

/** Mounted at /api/teams/:teamId (after requireTeamMember). */
export const rosterRouter = Router({ mergeParams: true });
rosterRouter.get("/members", async (req, res) => void res.json(await svc.roster(actorOf(req))));
rosterRouter.post("/invitations", async (req, res) => {
  const b = parse(InviteBodySchema, req.body);
  res.status(201).json(await svc.invite(actorOf(req), headersOf(req), b.email, b.role));
});
rosterRouter.post("/invitations/:invitationId/resend", async (req, res) =>
  void res.json(await svc.resendInvitation(actorOf(req), headersOf(req), req.params.invitationId)),
);
rosterRouter.delete("/invitations/:invitationId", async (req, res) => {
  await svc.cancelInvitation(actorOf(req), headersOf(req), req.params.invitationId);
  res.status(204).end();
});
rosterRouter.patch("/members/:memberId", async (req, res) => {
  const { role } = parse(RoleChangeBodySchema, req.body);
  res.json(await svc.changeRole(actorOf(req), req.params.memberId, role));
});
rosterRouter.delete("/members/:memberId", async (req, res) => {
  await svc.removeMember(actorOf(req), req.params.memberId);
  res.status(204).end();
});

/** Mounted at /api/invitations: the invitee may not be signed in yet. */
export const invitationRouter = Router();
invitationRouter.get("/:id", async (req, res) => void res.json(await svc.publicInvitation(req.params.id)));
invitationRouter.post("/:id/accept", async (req, res) => {
  const body = parse(AcceptInvitationBodySchema, req.body ?? {});
  const r = await svc.acceptInvitation(req.params.id, await readSession(req), headersOf(req), body);
  for (const c of r.setCookies) res.append("Set-Cookie", c);
  res.json({ teamId: r.teamId });
});
