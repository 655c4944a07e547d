import { Router, type Request, type RequestHandler, type Response } from "express";
import { actorOf, readAsTeamMember, readQueryAsTeamMember } from "../auth/context";
import { parse } from "../http/validate";
import { sendJsonText } from "../http/json-answer";
import { CompareQuery, ExportQuery, ProgressQuery, PublishShotBody, ReviewSettings, ShareShotBody, ShotListPageQuery } from "../../shared/schemas/readout";
import type { FileAnswer } from "./exports";
import { marksExport, reportExport, resultsExport } from "./exports";
import * as svc from "./service";
import { publishShot, shareShot, unpublishShot, unshareShot } from "./share";

/** Mounted at /api/teams/:teamId (after requireTeamMember). See docs/api.md, "Shot readout …". */
export const readoutRouter = Router({ mergeParams: true });

const shotId = (req: Request) => String(req.params.shotId);

/**
 * GET /api/teams/:teamId/readout/shots/:shotId, one shot's readout: a hot read mounted ahead of the
 * team's routers (server/routes.ts), whose one statement checks membership and reads the shot
 * (decision 195).
 */
export const shotReadoutRoute: RequestHandler = async (req, res) => {
  const { body, tag } = await readAsTeamMember(req, (a) => svc.readoutJson(a, shotId(req)));
  sendJsonText(res, body, tag);
};

/** The Shots page's list, a hot read (decision 195): a bad query is refused only once membership is known. */
export const shotListRoute: RequestHandler = async (req, res) => {
  const { body, tag } = await readQueryAsTeamMember(req, ShotListPageQuery, svc.listShots);
  sendJsonText(res, body, tag);
};

function sendFile(res: Response, f: FileAnswer) {
  res.setHeader("Content-Type", f.contentType);
  res.setHeader("Content-Disposition", `attachment; filename="${f.filename}"`);
  // Results change whenever marks are saved: never serve a stale copy.
  res.setHeader("Cache-Control", "no-store");
  res.send(f.body);
}

readoutRouter.get("/readout/compare", async (req, res) => void res.json(await svc.compare(actorOf(req), parse(CompareQuery, req.query))));
readoutRouter.get("/readout/players", async (req, res) => void res.json(await svc.players(actorOf(req))));
readoutRouter.get("/readout/progress", async (req, res) => void res.json(await svc.progress(actorOf(req), parse(ProgressQuery, req.query))));

readoutRouter.post("/readout/shots/:shotId/shares", async (req, res) => {
  const body = parse(ShareShotBody, req.body ?? {});
  res.status(201).json(await shareShot(actorOf(req), shotId(req), body));
});

readoutRouter.get("/readout/settings", async (req, res) => void res.json(await svc.reviewSettings(actorOf(req))));
readoutRouter.patch("/readout/settings", async (req, res) => void res.json(await svc.updateReviewSettings(actorOf(req), parse(ReviewSettings, req.body ?? {}))));

// The review step: PUT publishes the shot to its player (and teammates it is shared with), DELETE takes it back.
readoutRouter.put("/readout/shots/:shotId/publication", async (req, res) => {
  res.json(await publishShot(actorOf(req), shotId(req), parse(PublishShotBody, req.body ?? {})));
});
readoutRouter.delete("/readout/shots/:shotId/publication", async (req, res) => void res.json(await unpublishShot(actorOf(req), shotId(req))));

readoutRouter.delete("/readout/shots/:shotId/shares/:userId", async (req, res) => {
  await unshareShot(actorOf(req), shotId(req), String(req.params.userId));
  res.status(204).end();
});

readoutRouter.get("/readout/shots/:shotId/marks.csv", async (req, res) => sendFile(res, await marksExport(actorOf(req), shotId(req), parse(ExportQuery, req.query).units)));
readoutRouter.get("/readout/shots/:shotId/results.csv", async (req, res) => sendFile(res, await resultsExport(actorOf(req), shotId(req), parse(ExportQuery, req.query).units)));
readoutRouter.get("/readout/shots/:shotId/report.pdf", async (req, res) => sendFile(res, await reportExport(actorOf(req), shotId(req), parse(ExportQuery, req.query).units)));
