import { Router, type Express } from "express";
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
 * The reads every page load repeats most (the clips table, one shot's readout, the Shots list),
 * answered before Express walks the other routers, as routes of the app itself mounted in app.ts
 * after the checks every API request passes. Each checks the caller's membership in its own
 * statement (decision 195) rather than through requireTeamMember; every other team route goes
 * through apiRouter(). Not a router of their own (decision 198): entering a router mounted at /api
 * meant trimming and restoring the URL and a second walk of layers for these reads, and every
 * other API request entered it and left it again (a turn of the event loop in Express's router).
 */
export function mountHotReads(app: Express) {
  app.get("/api/teams/:teamId/clips", clipListRoute);
  app.get("/api/teams/:teamId/readout/shots/:shotId", shotReadoutRoute);
  app.get("/api/teams/:teamId/readout/shots", shotListRoute);
}
