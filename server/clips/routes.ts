import { Router } from "express";

/** Mounted at /api/teams/:teamId (after requireTeamMember). Clip ingest fills this in. */
export const clipsRouter = Router({ mergeParams: true });
