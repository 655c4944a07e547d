// The one problem handler: every error is one problem+json shape (extension members included),
// and an error after the answer began cuts the connection instead of leaving it open.
import express from "express";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { HttpError, problemHandler } from "../../server/http/problem";
import { VersionConflictError } from "../../server/shots/conflict";
import { ClipProblem } from "../../server/clips/ingest";

let server: http.Server;
let base: string;

beforeAll(async () => {
  const app = express();
  app.get("/stream", (_req, res, next) => {
    // A stream that has sent its head and a first chunk, then its source fails.
    res.writeHead(200, { "content-type": "text/event-stream" });
    res.write("event: run\ndata: {}\n\n");
    setTimeout(() => next(new Error("the source failed")), 20);
  });
  app.get("/conflict", () => {
    throw new VersionConflictError({ currentVersion: 7, savedBy: "Morgan Ashby", savedAt: "2026-12-03T10:00:00.000Z" });
  });
  app.get("/clip", () => {
    throw new ClipProblem(409, "duplicate_clip", "This file is already in the team.", { existingClipId: "c-1" });
  });
  app.get("/field", () => {
    throw new HttpError(422, "validation_failed", "file: unusable", [{ path: "file", message: "unusable" }]);
  });
  app.use(problemHandler);
  server = app.listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise((r) => server.close(r)));

describe("problem handler", () => {
  it("an error after the head was sent closes the connection: the client sees a broken answer, not an open one", async () => {
    const outcome = await new Promise<string>((resolve) => {
      const guard = setTimeout(() => resolve("still open after 3 s"), 3000);
      http.get(`${base}/stream`, (res) => {
        res.on("data", () => {});
        res.on("end", () => (clearTimeout(guard), resolve("ended as if complete")));
        res.on("aborted", () => (clearTimeout(guard), resolve("cut")));
        res.on("error", () => (clearTimeout(guard), resolve("cut")));
      }).on("error", () => (clearTimeout(guard), resolve("cut")));
    });
    expect(outcome).toBe("cut");
  });

  it("a version conflict is the same problem+json shape with who saved last as extension members", async () => {
    const r = await fetch(`${base}/conflict`);
    expect(r.status).toBe(409);
    expect(r.headers.get("content-type")).toMatch(/^application\/problem\+json/);
    expect(await r.json()).toEqual({
      type: "about:blank", title: "Conflict", status: 409, code: "version_conflict", detail: expect.stringContaining("Morgan Ashby saved this shot"),
      currentVersion: 7, savedBy: "Morgan Ashby", savedAt: "2026-12-03T10:00:00.000Z",
    });
  });

  it("a clip's refusal keeps its extension members outside the upload protocol too", async () => {
    const r = await fetch(`${base}/clip`);
    expect(await r.json()).toMatchObject({ status: 409, code: "duplicate_clip", existingClipId: "c-1" });
  });

  it("field errors travel as `errors`", async () => {
    const r = await fetch(`${base}/field`);
    expect(await r.json()).toMatchObject({ status: 422, code: "validation_failed", errors: [{ path: "file", message: "unusable" }] });
  });
});
