import { Router } from "express";
import { actorOf } from "../auth/context";
import { home } from "./service";

/** Mounted at /api/teams/:teamId (after requireTeamMember). See docs/api.md, "Home". */
export const homeRouter = Router({ mergeParams: true });
homeRouter.get("/home", async (req, res) => void res.json(await home(actorOf(req))));
