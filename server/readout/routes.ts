import { Router } from "express";

/** Mounted at /api/teams/:teamId (after requireTeamMember). */
export const readoutRouter = Router({ mergeParams: true });
