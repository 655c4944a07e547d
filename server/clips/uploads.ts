// The resumable upload endpoint (tus 1.0 via @tus/server) at /api/uploads. Who may upload, the
// size and the team's quota are checked when the upload is created, before any byte arrives;
// the file becomes a clip in onUploadFinish (see ingest.ts). Unfinished uploads live in
// <UPLOAD_DIR>/.tus until they finish, are cancelled, or go stale.
import { readdir, rm, stat, statfs } from "node:fs/promises";
import path from "node:path";
import type { Express, Request as ExpressRequest, Response as ExpressResponse } from "express";
import { Server, Metadata, type Upload } from "@tus/server";
import { NodeRequest, sendNodeResponse } from "srvx/node";
import { FileStore } from "@tus/file-store";
import { auth } from "../auth/auth";
import { roleIn } from "../auth/context";
import { policy, type Actor } from "../auth/policy";
import { env } from "../env";
import { log } from "../log";
import { HttpError, PROBLEM_TYPE, problemBody, problemJson, zodToHttp } from "../http/problem";
import { asUploadProblem } from "../http/upload-problems";
import { StorageError } from "../storage/types";
import { ClipMetaSchema, type ClipMeta } from "../../shared/schemas/clips";
import { checkMetaRefs, ClipProblem, ingestUpload, requireSequenceRate } from "./ingest";
import { tusDir } from "./deps";
import { clipInTeam, teamUsageBytes } from "../entities/clip/repository";
import { storageAllowance, storageRefusal } from "../billing/limits";
import { storageText } from "../../shared/billing/plans";
import { toSummary } from "./present";
import { PgUploadLocker } from "./upload-lock";

export const UPLOAD_PATH = "/api/uploads";
/** An unfinished upload untouched this long is removed. */
export const STALE_UPLOAD_MS = 24 * 3600_000;

type TusRequest = Parameters<NonNullable<ConstructorParameters<typeof Server>[0]["onIncomingRequest"]>>[0];

const sizeText = storageText;

/** tus hooks answer by throwing { status_code, body }; our bodies are problem+json documents. */
function tusProblem(status: number, code: string, detail: string, extra: Record<string, unknown> = {}) {
  return { status_code: status, body: problemJson(status, code, detail, extra) };
}

function toTusError(err: unknown) {
  if (err instanceof HttpError) return { status_code: err.status, body: problemBody(err) };
  if (err && typeof err === "object" && "status_code" in err) return err as { status_code: number; body: string };
  // Say what is wrong with the server's disk rather than "internal": the person can tell an admin.
  const code = err instanceof StorageError ? err.code : (err as NodeJS.ErrnoException | null)?.code;
  if (code === "disk_full" || code === "ENOSPC" || code === "EDQUOT")
    return tusProblem(507, "disk_full", "The server's storage is full, so the upload was stopped and nothing was kept. Tell your team admin; the upload can resume once space is freed.");
  if (code === "unwritable" || code === "EROFS" || code === "EACCES" || code === "EPERM")
    return tusProblem(503, "storage_unwritable", "The server cannot write to its storage right now, so nothing was kept. Tell your team admin.");
  log.error({ err }, "upload failed");
  return tusProblem(500, "internal", "The upload could not be processed on our side. Try again; if it keeps happening, tell your team admin.");
}

const notFound = () => tusProblem(404, "not_found", "That upload was not found, or you do not have access to it.");

async function actorFor(req: TusRequest, teamId: string): Promise<Actor> {
  // Writes (create, chunks, cancel) ask the database, so a signed-out session cannot add bytes.
  const s = await auth().api.getSession({ headers: req.headers, query: { disableCookieCache: req.method !== "HEAD" && req.method !== "GET" } });
  if (!s) throw tusProblem(401, "unauthenticated", "Please sign in to continue.");
  const role = teamId ? await roleIn(s.user.id, teamId) : null;
  if (!role) throw tusProblem(404, "not_found", "That team was not found, or you do not have access to it.");
  const actor = { userId: s.user.id, teamId, role };
  if (!policy.uploadClip(actor)) throw tusProblem(403, "forbidden", "Your role in this team does not allow uploading clips.");
  return actor;
}

function parseMeta(raw: string | null | undefined): ClipMeta {
  let json: unknown;
  try {
    json = JSON.parse(raw ?? "");
  } catch {
    throw new HttpError(422, "validation_failed", "The upload carries no clip details. Fill in the form for this file and start again.");
  }
  const r = ClipMetaSchema.safeParse(json);
  if (!r.success) throw zodToHttp(r.error);
  return r.data;
}

/**
 * Bytes the team's unfinished uploads have received so far. Counting what they declared instead
 * let one started-and-abandoned upload hold most of the quota until the stale sweep (24 h); the
 * declared size is checked again when an upload finishes (quotaAtFinish).
 */
async function pendingBytes(store: FileStore, teamId: string): Promise<number> {
  let total = 0;
  for (const id of await store.configstore.list!().catch(() => [] as string[])) {
    const u = await store.configstore.get(id);
    if (u?.metadata?.teamId === teamId) total += (await stat(path.join(tusDir(), id)).catch(() => null))?.size ?? 0;
  }
  return total;
}

/** The club's stored bytes plus what its unfinished uploads hold, against its plan. */
async function storageInUse(store: FileStore, teamId: string) {
  const allowance = await storageAllowance(teamId);
  let used = 0;
  for (const t of allowance.teamIds) used += (await teamUsageBytes(t)) + (await pendingBytes(store, t));
  return { allowance, used };
}

export function discardUpload(id: string) {
  const dir = tusDir();
  return Promise.all([rm(path.join(dir, id), { force: true }), rm(path.join(dir, `${id}.json`), { force: true })]);
}

/** Remove unfinished uploads whose file has not grown for maxAgeMs, and halves of pairs. */
export async function sweepStaleUploads(maxAgeMs = STALE_UPLOAD_MS): Promise<number> {
  const dir = tusDir();
  const names = await readdir(dir).catch(() => [] as string[]);
  const ids = new Set(names.map((n) => n.replace(/\.json$/, "")));
  let removed = 0;
  for (const id of ids) {
    const data = await stat(path.join(dir, id)).catch(() => null);
    const info = await stat(path.join(dir, `${id}.json`)).catch(() => null);
    const touched = Math.max(data?.mtimeMs ?? 0, info?.mtimeMs ?? 0);
    const halfPair = !data || !info;
    if (Date.now() - touched > (halfPair ? Math.min(maxAgeMs, 3600_000) : maxAgeMs)) {
      await discardUpload(id);
      removed++;
    }
  }
  return removed;
}

let tus: Server | undefined;
let locker: PgUploadLocker | undefined;
export function uploadServer(): Server {
  if (tus) return tus;
  const e = env();
  const store = new FileStore({ directory: tusDir() });
  const actors = new WeakMap<TusRequest, Actor>();
  locker = new PgUploadLocker(e.DATABASE_URL);
  tus = new Server({
    path: UPLOAD_PATH,
    datastore: store,
    // Any web process may serve any request of an upload: the lock lives in PostgreSQL.
    locker,
    relativeLocation: true,
    allowedOrigins: [new URL(e.PUBLIC_URL).origin],
    // The size limit is ours (onUploadCreate), to answer with our message rather than tus's.
    maxSize: 0,
    onIncomingRequest: async (req, uploadId) => {
      if (req.method === "POST") {
        // Upload-Metadata names the team (and the clip's details); without it, or garbled, say so.
        let md: Record<string, string | null>;
        try {
          md = Metadata.parse(req.headers.get("upload-metadata") ?? undefined);
        } catch {
          throw tusProblem(400, "metadata_missing", "Start the upload with Upload-Metadata naming the team (teamId) and the file (filename).");
        }
        actors.set(req, await actorFor(req, md.teamId ?? ""));
        return;
      }
      const upload = await store.getUpload(uploadId).catch(() => {
        throw notFound();
      });
      const actor = await actorFor(req, upload.metadata?.teamId ?? "").catch((err) => {
        throw err.status_code === 401 ? err : notFound();
      });
      if (upload.metadata?.userId !== actor.userId) throw notFound();
    },
    onUploadCreate: async (req, upload) => {
      try {
        const actor = actors.get(req)!;
        const size = upload.size;
        if (size === undefined) throw new HttpError(400, "length_required", "Send the file's size when the upload starts (Upload-Length).");
        if (size === 0) throw new ClipProblem(422, "empty_file", "The file is empty (0 bytes). Nothing was stored; please upload the clip again.");
        if (size > e.MAX_UPLOAD_BYTES)
          throw new ClipProblem(413, "too_large", `The file is ${sizeText(size)}; one clip can be at most ${sizeText(e.MAX_UPLOAD_BYTES)}. Trim the clip around the shot, or export it at a smaller size.`, { maxBytes: e.MAX_UPLOAD_BYTES });
        const meta = parseMeta(upload.metadata?.meta);
        const filename = upload.metadata?.filename ?? "";
        await checkMetaRefs(actor.teamId, meta);
        if (/\.zip$/i.test(filename)) requireSequenceRate(meta);
        // The club's plan sets the storage its teams share (server/billing/limits.ts).
        const { allowance, used } = await storageInUse(store, actor.teamId);
        if (used + size > allowance.limitBytes)
          throw new ClipProblem(413, "quota_exceeded", storageRefusal(allowance, size, used), { quotaBytes: allowance.limitBytes, usedBytes: used, plan: allowance.plan.id });
        const free = await statfs(tusDir()).then((s) => s.bavail * s.bsize).catch(() => Infinity);
        if (free < size * 2 + 512 * 1024 ** 2)
          throw new ClipProblem(507, "disk_full", "The server is short of disk space for this file right now. Try again later, or tell your team admin.");
        return { metadata: { teamId: actor.teamId, userId: actor.userId, filename, meta: JSON.stringify(meta) } };
      } catch (err) {
        throw toTusError(err);
      }
    },
    onUploadFinish: async (req, upload) => {
      const md = upload.metadata ?? {};
      try {
        // Several uploads started together may each have fitted; the one finishing last over the
        // plan is refused here, before it becomes a clip (its own bytes are among the pending).
        const { allowance, used } = await storageInUse(store, md.teamId!);
        if (used > allowance.limitBytes)
          throw new ClipProblem(413, "quota_exceeded", storageRefusal(allowance, upload.size ?? 0, used - (upload.size ?? 0)), { quotaBytes: allowance.limitBytes, usedBytes: used - (upload.size ?? 0), plan: allowance.plan.id });
        const row = await ingestUpload({
          teamId: md.teamId!,
          userId: md.userId!,
          file: path.join(tusDir(), upload.id),
          originalName: md.filename ?? "",
          meta: parseMeta(md.meta),
          reqId: req.headers.get("x-request-id") ?? undefined,
        });
        const joined = await clipInTeam(row.teamId, row.id);
        return { status_code: 200, headers: { "Content-Type": "application/json" }, body: JSON.stringify({ clip: joined ? toSummary(joined) : null }) };
      } catch (err) {
        throw toTusError(err);
      } finally {
        await discardUpload(upload.id);
      }
    },
    // tus's own plain-text errors pass through and become problem+json in asUploadProblem.
    onResponseError: (_req, err) => {
      const e = err as { status_code?: number; body?: string };
      return e.status_code ? { status_code: e.status_code, body: e.body ?? "" } : toTusError(err);
    },
  });
  return tus;
}

export type { Upload };

/** Closes the upload lock's connection (at shutdown; any lock it held is freed with it). */
export async function closeUploads() {
  await locker?.close();
}

/** Mount on the app before any body parser (tus reads the raw stream). */
export function mountUploads(app: Express) {
  const handle = async (req: ExpressRequest, res: ExpressResponse) => {
    if (req.method === "GET") {
      res.status(405).type(PROBLEM_TYPE).send(problemJson(405, "method_not_allowed", "Uploads cannot be downloaded; open the clip instead."));
      return;
    }
    // Server.handle() with the answer rewritten on its way out: every error is problem+json.
    const answer = await uploadServer().handleWeb(new NodeRequest({ req, res }));
    await sendNodeResponse(res, await asUploadProblem(answer));
  };
  app.all(UPLOAD_PATH, handle);
  app.all(`${UPLOAD_PATH}/*splat`, handle);
  const sweep = () => void sweepStaleUploads().catch((err) => log.warn({ err }, "upload sweep failed"));
  setTimeout(sweep, 10_000).unref();
  setInterval(sweep, 30 * 60_000).unref();
}
