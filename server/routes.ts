import { Router } from "express";
import { requireTeamMember } from "./auth/context";
import { meRouter } from "./me/routes";
import { invitationRouter, rosterRouter } from "./roster/routes";
import { auditRouter } from "./audit/routes";
import { clipListRoute, clipsRouter } from "./clips/routes";
import { shotsRouter } from "./shots/routes";
import { trackingRouter } from "./tracking/routes";
import { sticksRouter } from "./sticks/routes";
import { readoutRouter, shotListRoute, shotReadoutRoute } from "./readout/routes";
import { billingRouter } from "./billing/routes";
import { signupRouter } from "./signup/routes";
import { homeRouter } from "./home/routes";

// Every API router, in one list. Team-scoped features mount on `team` and find the caller's
// role in req.actor (set by requireTeamMember: non-members get 404, so nothing leaks).
export function apiRouter() {
  const api = Router();
  api.use("/me", meRouter);
  api.use("/invitations", invitationRouter);
  api.use("/signup", signupRouter);

  const team = Router({ mergeParams: true });
  team.use(requireTeamMember);
  team.use(rosterRouter);
  team.use(auditRouter);
  team.use(clipsRouter);
  team.use(shotsRouter);
  team.use(trackingRouter);
  team.use(sticksRouter);
  team.use(readoutRouter);
  team.use(billingRouter);
  team.use(homeRouter);
  api.use("/teams/:teamId", team);
  return api;
}

/**
 * The reads every page load repeats most (the clips table, one shot's readout, the Shots list), answered
 * before Express walks the other routers, mounted at /api in app.ts after the checks every API
 * request passes. Each checks the caller's membership in its own statement (decision 195) rather
 * than through requireTeamMember; every other team route goes through apiRouter().
 */
export function hotReadsRouter() {
  const hot = Router();
  hot.get("/teams/:teamId/clips", clipListRoute);
  hot.get("/teams/:teamId/readout/shots/:shotId", shotReadoutRoute);
  hot.get("/teams/:teamId/readout/shots", shotListRoute);
  return hot;
}
