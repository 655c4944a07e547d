// The protective headers are computed once at start-up from helmet's own middleware (decision
// 177). Held here to helmet itself: two real servers, one running helmet on every request and one
// sending the recorded set, must answer with exactly the same headers.
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import express, { type RequestHandler } from "express";
import helmet from "helmet";
import { afterAll, describe, expect, it } from "vitest";
import { helmetOptions, securityHeaders } from "../../../server/security/headers";

const servers: Server[] = [];
afterAll(() => Promise.all(servers.map((s) => new Promise((r) => s.close(r)))));

async function headersFrom(middleware: RequestHandler, path: string) {
  const app = express();
  app.disable("x-powered-by");
  app.use(middleware);
  app.get("/{*splat}", (_req, res) => res.type("json").send('{"ok":true}'));
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  servers.push(server);
  const r = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}${path}`);
  // Only what changes from one answer to the next is left out.
  return [...r.headers].filter(([k]) => !["date", "etag", "connection", "keep-alive"].includes(k));
}

describe("security headers computed once", () => {
  for (const https of [false, true]) {
    it(`are exactly helmet's (${https ? "https" : "plain http"})`, async () => {
      for (const path of ["/", "/api/health", "/assets/x.js?y=1"]) {
        const fromHelmet = await headersFrom(helmet(helmetOptions(https)), path);
        const set = securityHeaders(helmetOptions(https));
        const recorded = await headersFrom((_req, res, next) => (set(res), next()), path);
        expect(recorded, path).toEqual(fromHelmet);
        expect(fromHelmet.map(([k]) => k)).toContain("content-security-policy");
        expect(fromHelmet.some(([k]) => k === "strict-transport-security")).toBe(https);
      }
    });
  }
});
