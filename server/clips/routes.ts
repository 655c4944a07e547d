import { Router, type Request, type RequestHandler, type Response } from "express";
import { z } from "zod";
import { actorOf, readQueryAsTeamMember } from "../auth/context";
import { sendJsonText } from "../http/json-answer";
import { HttpError } from "../http/problem";
import { parse } from "../http/validate";
import { streamPolled } from "../http/polled-stream";
import { clipKeys } from "../storage";
import { thumbnailKey } from "../jobs/clip-extract";
import { ClipListQuerySchema, ClipPatchSchema } from "../../shared/schemas/clips";
import * as svc from "./service";
import { clipById } from "../entities/clip/repository";
import { toProgress } from "./present";
import { sendImage, sendOriginal, videoMime } from "./serve";

/** Mounted at /api/teams/:teamId (after requireTeamMember). Uploads themselves go to /api/uploads (tus). */
export const clipsRouter = Router({ mergeParams: true });

/**
 * GET /api/teams/:teamId/clips, the clips table: a hot read mounted ahead of the team's routers
 * (server/routes.ts), whose one statement checks membership and builds the page (decision 195).
 */
export const clipListRoute: RequestHandler = async (req, res) => {
  const { body, tag } = await readQueryAsTeamMember(req, ClipListQuerySchema, svc.listText);
  sendJsonText(res, body, tag);
};

const FrameNumber = z.coerce.number({ message: "Frame numbers start at 1" }).int("Frame numbers are whole numbers").min(1, "Frame numbers start at 1");
const id = (req: Request) => String(req.params.clipId);

clipsRouter.get("/clip-options", async (req, res) => void res.json(await svc.options(actorOf(req))));
clipsRouter.get("/clips/:clipId", async (req, res) => void res.json(await svc.get(actorOf(req), id(req))));
clipsRouter.patch("/clips/:clipId", async (req, res) => void res.json(await svc.patch(actorOf(req), id(req), parse(ClipPatchSchema, req.body))));
clipsRouter.get("/clips/:clipId/deletion", async (req, res) => void res.json(await svc.deletionCounts(actorOf(req), id(req))));
clipsRouter.delete("/clips/:clipId", async (req, res) => {
  await svc.remove(actorOf(req), id(req));
  res.status(204).end();
});
clipsRouter.post("/clips/:clipId/retry", async (req, res) => void res.json(await svc.retry(actorOf(req), id(req), req.id)));

clipsRouter.get("/clips/:clipId/progress", async (req, res) => {
  const first = await svc.progress(actorOf(req), id(req));
  if (req.accepts(["application/json", "text/event-stream"]) !== "text/event-stream") {
    res.set("Cache-Control", "no-store").json(first);
    return;
  }
  await streamProgress(req, res, first.id);
});

/** Server-Sent Events: a `progress` event on every change, ending at ready/failed (or `gone`). */
function streamProgress(req: Request, res: Response, clipId: string) {
  return streamPolled(req, res, {
    read: () => clipById(clipId),
    event: "progress",
    missingEvent: "gone",
    present: toProgress,
    finished: (row) => row.status === "ready" || row.status === "failed",
    intervalMs: 400,
  });
}

clipsRouter.get("/clips/:clipId/frames/:n", async (req, res) => {
  const j = await svc.visibleClip(actorOf(req), id(req));
  const n = parse(FrameNumber, req.params.n);
  const c = j.clip;
  if (c.frameCount !== null && n > c.frameCount) throw new HttpError(404, "no_such_frame", `This clip has ${c.frameCount} frames; there is no frame ${n}.`);
  const fmt = c.frameFormat === "webp" ? "webp" : "jpg";
  await sendImage(res, clipKeys.frame(c.id, n, fmt), fmt === "jpg" ? "image/jpeg" : "image/webp",
    new HttpError(404, "frame_not_ready", `Frame ${n} has not been extracted yet (${c.framesDone} of ${c.frameCount ?? "?"} done).`));
});

clipsRouter.get("/clips/:clipId/strip", async (req, res) => {
  const j = await svc.visibleClip(actorOf(req), id(req));
  await sendImage(res, clipKeys.strip(j.clip.id), "image/jpeg", new HttpError(404, "strip_not_ready", "The preview strip is made once every frame is extracted."));
});

clipsRouter.get("/clips/:clipId/thumbnail", async (req, res) => {
  const j = await svc.visibleClip(actorOf(req), id(req));
  await sendImage(res, thumbnailKey(j.clip.id), "image/jpeg", new HttpError(404, "thumbnail_not_ready", "The thumbnail appears with the first frame."));
});

clipsRouter.get("/clips/:clipId/original", async (req, res) => {
  const j = await svc.visibleClip(actorOf(req), id(req));
  const probe = j.clip.probe as { formatName?: string; sequence?: unknown } | null;
  const name = j.clip.originalName || "clip";
  // An uploaded ZIP of frames is kept as one Matroska file of those frames (decision 134).
  await sendOriginal(req, res, clipKeys.original(j.clip.id), videoMime(probe?.formatName), probe?.sequence ? name.replace(/(\.zip)?$/i, ".mkv") : name);
});
