import { Router } from "express";

/** Mounted at /api/teams/:teamId (after requireTeamMember). */
export const shotsRouter = Router({ mergeParams: true });
