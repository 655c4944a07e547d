import { Router, type Request, type Response } from "express";
import multer from "multer";
import { policy } from "../auth/policy";
import { actorOf } from "../auth/context";
import { HttpError } from "../http/problem";
import { parse } from "../http/validate";
import { uuidOr404 } from "../http/ids";
import { READINGS_LIMITS } from "../../shared/mechanics/sticklab";
import { StickCreateSchema, StickPatchSchema, StickSettingsSchema } from "../../shared/schemas/sticks";
import { addBenchTest, addBenchTestCsv, csvTooLarge, deleteBenchTest } from "./bench-service";
import { beamFromShotRequest, solveBeamRequest } from "./beam-service";
import * as svc from "./service";

/** A path id that is not a uuid names nothing (and would make PostgreSQL complain). */
const idParam = (req: Request, name: string, what: string) => uuidOr404(String(req.params[name] ?? ""), what);

// Readings files are small: the engine's limit is 1 MB; multer stops reading past it.
const csvUpload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: READINGS_LIMITS.maxBytes, files: 1, fields: 10, fieldSize: 1000, parts: 12 },
}).single("file");

function readCsvUpload(req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) =>
    csvUpload(req, res, (err: unknown) => {
      if (!err) return resolve();
      if (err instanceof multer.MulterError) {
        if (err.code === "LIMIT_FILE_SIZE") return reject(csvTooLarge(null));
        const message =
          err.code === "LIMIT_UNEXPECTED_FILE" ? `send one CSV file, in the field "file" (got "${err.field}")` : `the upload was refused: ${err.message}`;
        return reject(new HttpError(422, "validation_failed", message, [{ path: "file", message }]));
      }
      reject(err);
    }),
  );
}

/** Mounted at /api/teams/:teamId (after requireTeamMember). Rules: service.ts, bench-service.ts, beam-service.ts. */
export const sticksRouter = Router({ mergeParams: true });

sticksRouter.get("/sticks", async (req, res) => void res.json(await svc.listSticks(actorOf(req))));
sticksRouter.post("/sticks", async (req, res) => {
  const body = parse(StickCreateSchema, req.body);
  res.status(201).json(await svc.createStick(actorOf(req), body));
});
sticksRouter.get("/sticks/:stickId", async (req, res) => void res.json(await svc.stickDetail(actorOf(req), idParam(req, "stickId", "That stick"))));
sticksRouter.patch("/sticks/:stickId", async (req, res) => {
  const id = idParam(req, "stickId", "That stick");
  res.json(await svc.updateStick(actorOf(req), id, parse(StickPatchSchema, req.body)));
});
sticksRouter.delete("/sticks/:stickId", async (req, res) => {
  await svc.deleteStick(actorOf(req), idParam(req, "stickId", "That stick"));
  res.status(204).end();
});

sticksRouter.post("/sticks/:stickId/bench-tests", async (req, res) => {
  res.status(201).json(await addBenchTest(actorOf(req), idParam(req, "stickId", "That stick"), req.body));
});
sticksRouter.post("/sticks/:stickId/bench-tests/csv", async (req, res) => {
  const a = actorOf(req);
  const id = idParam(req, "stickId", "That stick");
  await svc.editableStick(a, id, policy.runBenchTest); // refuse before reading the upload
  await readCsvUpload(req, res);
  res.status(201).json(await addBenchTestCsv(a, id, req.file, { ...(req.body ?? {}) }));
});
sticksRouter.delete("/sticks/:stickId/bench-tests/:testId", async (req, res) => {
  await deleteBenchTest(actorOf(req), idParam(req, "stickId", "That stick"), idParam(req, "testId", "That bench test"));
  res.status(204).end();
});

sticksRouter.patch("/stick-lab/settings", async (req, res) => void res.json(await svc.updateSettings(actorOf(req), parse(StickSettingsSchema, req.body))));

sticksRouter.post("/beam", (req, res) => void res.json(solveBeamRequest(actorOf(req), req.body)));
sticksRouter.get("/beam/shots/:shotId", async (req, res) => void res.json(await beamFromShotRequest(actorOf(req), idParam(req, "shotId", "That shot"))));
