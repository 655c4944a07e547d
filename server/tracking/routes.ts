import { Router, type Request, type Response } from "express";
import { actorOf, signedInOf } from "../auth/context";
import { parse } from "../http/validate";
import { streamPolled } from "../http/polled-stream";
import { StartTrackingBody } from "../../shared/schemas/tracking";
import * as svc from "./service";

/** Mounted at /api/teams/:teamId (after requireTeamMember). See docs/api.md, "Tracking". */
export const trackingRouter = Router({ mergeParams: true });

const shotId = (req: Request) => String(req.params.shotId);

trackingRouter.post("/shots/:shotId/tracking", async (req, res) => {
  const body = parse(StartTrackingBody, req.body) as StartTrackingBody;
  const r = await svc.startTracking(actorOf(req), shotId(req), body, req.id);
  res.status(r.started ? 202 : 200).json(r);
});

trackingRouter.get("/shots/:shotId/tracking", async (req, res) => {
  const first = await svc.getTracking(actorOf(req), shotId(req));
  if (req.accepts(["application/json", "text/event-stream"]) !== "text/event-stream") {
    res.set("Cache-Control", "no-store").json(first);
    return;
  }
  await streamRun(req, res, actorOf(req).teamId, shotId(req));
});

trackingRouter.delete("/shots/:shotId/tracking", async (req, res) => {
  await svc.cancelTracking(actorOf(req), shotId(req), signedInOf(req).user.name || "another analyst");
  res.status(204).end();
});

/**
 * Server-Sent Events: `run` with the run's progress on every change (its proposals once it is
 * done, failed or cancelled, which ends the stream), or `none` when the shot has no run.
 */
function streamRun(req: Request, res: Response, teamId: string, id: string) {
  const live = (run: { status: string }) => run.status === "queued" || run.status === "running";
  return streamPolled(req, res, {
    read: () => svc.latestFor(teamId, id),
    event: "run",
    missingEvent: "none",
    present: (run) => (live(run) ? { ...run, proposals: null } : run),
    finished: (run) => !live(run),
    intervalMs: 250,
  });
}
