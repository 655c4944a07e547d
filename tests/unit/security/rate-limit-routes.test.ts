// Which requests a rate limit counts, found in one pass (decision 196), must be exactly what the
// limits mounted as Express layers counted (app.use(path) per limit, wrapped to count only POSTs or
// only writes): held here to Express's own router, over real HTTP with raw request paths.
import http from "node:http";
import type { AddressInfo } from "node:net";
import express, { type RequestHandler } from "express";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LIMITED_ROUTES, limitedRouteOf } from "../../../server/security/rate-limits";

let server: http.Server;
let port = 0;

beforeAll(async () => {
  // The mounting as it was before decision 196: one layer per limited path.
  const app = express();
  const counts = { all: () => true, writes: (m: string) => m !== "GET" && m !== "HEAD", posts: (m: string) => m === "POST" };
  for (const r of LIMITED_ROUTES) {
    const mark: RequestHandler = (req, res, next) => (counts[r.counted](req.method) ? void res.set("x-limit", r.name).end() : next());
    app.use([...r.paths], mark);
  }
  app.use((_req, res) => void res.set("x-limit", "none").end());
  server = await new Promise<http.Server>((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  port = (server.address() as AddressInfo).port;
});
afterAll(() => new Promise((r) => server.close(r)));

/** The limit Express's layers chose for this raw request line. */
const expressChoice = (method: string, path: string) =>
  new Promise<string>((resolve, reject) => {
    const q = http.request({ host: "127.0.0.1", port, method, path }, (res) => {
      res.resume();
      resolve(String(res.headers["x-limit"]));
    });
    q.on("error", reject);
    q.end();
  });

const PATHS = [
  "/api/auth/sign-in/email", "/API/Auth/Sign-In/Email", "/api/auth/sign-in", "/api/auth/sign-in/", "/api/auth/sign-inx", "/api/auth/sign-in.json",
  "/api/auth/sign-out", "/api/auth/request-password-reset", "/api/auth/reset-password/abc-123", "/api/auth/reset-passwords",
  "/api/teams/t1/invitations", "/api/teams/T-1/Invitations/x/resend", "/api/teams/t%20x/invitations", "/api/teams//invitations",
  "/api/teams/a/b/invitations", "/api/teams/t1/invitationsx", "/api/teams/t1/members",
  "/api/signup", "/api/signup/", "/api/signup/confirm", "/api/signups", "/api/uploads", "/api/uploads/abc", "/API/UPLOADS",
  "//api/uploads", "/x/api/uploads", "/api", "/", "/assets/app.js", "/api/health",
];
const METHODS = ["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE", "OPTIONS"];

describe("the limited route of a request", () => {
  it("is the one Express's layers chose, for every method and path", async () => {
    let counted = 0;
    for (const path of PATHS)
      for (const method of METHODS) {
        const want = await expressChoice(method, path);
        const got = limitedRouteOf(method, path)?.name ?? "none";
        expect(got, `${method} ${path}`).toBe(want);
        if (got !== "none") counted++;
      }
    // The table is not trivially "none": every limit counts some of these requests.
    expect(counted).toBeGreaterThan(20);
    for (const r of LIMITED_ROUTES) expect(PATHS.some((p) => limitedRouteOf("POST", p) === r), r.name).toBe(true);
  });
});
