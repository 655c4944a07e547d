import { Router, type Request, type Response } from "express";
import { actorOf, signedInOf } from "../auth/context";
import { parse } from "../http/validate";
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
async function streamRun(req: Request, res: Response, teamId: string, id: string) {
  res.status(200).set({ "Content-Type": "text/event-stream", "Cache-Control": "no-store", Connection: "keep-alive", "X-Accel-Buffering": "no" });
  res.flushHeaders();
  let last = "";
  let closed = false;
  req.on("close", () => (closed = true));
  let beat = Date.now();
  while (!closed) {
    const run = await svc.latestFor(teamId, id);
    if (!run) {
      res.write(`event: none\ndata: {}\n\n`);
      break;
    }
    const live = run.status === "queued" || run.status === "running";
    const data = JSON.stringify(live ? { ...run, proposals: null } : run);
    if (data !== last) {
      res.write(`event: run\ndata: ${data}\n\n`);
      last = data;
      beat = Date.now();
    } else if (Date.now() - beat > 15_000) {
      res.write(`: still working\n\n`);
      beat = Date.now();
    }
    if (!live) break;
    await new Promise((r) => setTimeout(r, 250));
  }
  res.end();
}
