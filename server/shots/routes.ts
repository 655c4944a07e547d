import { Router, type Request } from "express";
import { actorOf } from "../auth/context";
import { parse } from "../http/validate";
import { CalibrationBody, CreateShotBody, SaveMarksBody, UpdateShotBody, type SaveMarksBody as SaveMarks } from "../../shared/schemas/shots";
import * as svc from "./service";

/** Mounted at /api/teams/:teamId (after requireTeamMember). See docs/api.md, "Shots". */
export const shotsRouter = Router({ mergeParams: true });

const p = (req: Request, name: string) => String(req.params[name]);

shotsRouter.get("/clips/:clipId/shots", async (req, res) => void res.json(await svc.listShots(actorOf(req), p(req, "clipId"))));
shotsRouter.post("/clips/:clipId/shots", async (req, res) => {
  const body = parse(CreateShotBody, req.body);
  res.status(201).json(await svc.createShot(actorOf(req), p(req, "clipId"), body));
});
shotsRouter.put("/clips/:clipId/calibration", async (req, res) => {
  const { calibration } = parse(CalibrationBody, req.body);
  res.json(await svc.setCalibration(actorOf(req), p(req, "clipId"), calibration, req.id));
});

shotsRouter.get("/shots/:shotId", async (req, res) => void res.json(await svc.getShot(actorOf(req), p(req, "shotId"))));
shotsRouter.patch("/shots/:shotId", async (req, res) => {
  const body = parse(UpdateShotBody, req.body);
  res.json(await svc.updateShot(actorOf(req), p(req, "shotId"), body));
});
shotsRouter.put("/shots/:shotId/marks", async (req, res) => {
  const body = parse(SaveMarksBody, req.body) as SaveMarks;
  res.json(await svc.saveMarks(actorOf(req), p(req, "shotId"), body));
});
shotsRouter.delete("/shots/:shotId", async (req, res) => {
  await svc.deleteShot(actorOf(req), p(req, "shotId"));
  res.status(204).end();
});

