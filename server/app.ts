import fs from "node:fs";
import path from "node:path";
import express from "express";
import { toNodeHandler } from "better-auth/node";
import { auth } from "./auth/auth";
import { env } from "./env";
import { lazyRequestLoggers } from "./log";
import { problemHandler, sendProblem } from "./http/problem";
import { leanJsonAnswers } from "./http/json-answer";
import { everyRequest } from "./http/every-request";
import { asProblemResponse } from "./http/better-auth-errors";
import { authRouteGuard } from "./auth/http-routes";
import { apiRouter, mountHotReads } from "./routes";
import { mountHealthRoutes } from "./health/routes";
import { mountRawRoutes } from "./raw-routes";
import { rateLimitFor, signInFailureLimit } from "./security/rate-limits";
import { refuseCrossSiteWrite } from "./security/same-origin";
import { helmetOptions, securityHeaders } from "./security/headers";
import { trustedOrigins } from "./security/origins";
import { refuseWritesWhenUnpaid } from "./billing/read-only-guard";
import { clientEntryOf, nameClientBuild } from "./http/client-build";

export const TRACKING_WORKER_CSP =
  "default-src 'self'; script-src 'self' 'unsafe-eval' 'wasm-unsafe-eval'; connect-src 'self'; img-src 'self' data: blob:; object-src 'none'";

export function createApp() {
  const e = env();
  const app = express();
  app.disable("x-powered-by");
  // API JSON written in one piece with a cheap validator (decision 177).
  leanJsonAnswers(app);
  lazyRequestLoggers(app.request);
  // Forwarded addresses count only when TRUST_PROXY names the proxy (decision 112).
  app.set("trust proxy", e.TRUST_PROXY ?? false);
  // The request id and log line, security headers, API guards, rate limits and the unpaid
  // read-only state, in one layer with the order and answers of decisions 112, 177, 182, 183
  // (decision 196). Cross-site writes are refused on every API route, better-auth's included.
  app.use(
    everyRequest({
      // helmet's headers, computed once at start-up (decision 177).
      setSecurityHeaders: securityHeaders(helmetOptions(e.PUBLIC_URL.startsWith("https://"))),
      refuseCrossSiteWrite: refuseCrossSiteWrite(() => trustedOrigins()),
      rateLimitFor: rateLimitFor(e.RATE_LIMIT),
      // A club whose payment is overdue past its grace: its teams take no writes (reads always work).
      refuseWritesWhenUnpaid: refuseWritesWhenUnpaid(),
    }),
  );
  // Liveness and readiness, and the hot reads, once every check above has passed; what follows
  // is for the auth library, uploads and request bodies, none of which they use (decisions 195, 196).
  mountHealthRoutes(app);
  mountHotReads(app);

  // better-auth: only the routes the product uses, with a small checked body (mounted before
  // express.json()); its error answers rewritten as problem+json.
  app.use("/api/auth", authRouteGuard);
  app.use("/api/auth/sign-in/email", signInFailureLimit(e.RATE_LIMIT));
  const authHandler = toNodeHandler(async (request: Request) => asProblemResponse(await auth().handler(request)));
  app.all("/api/auth/*splat", (req, res) => void authHandler(req, res));

  const dist = path.resolve("dist");
  const built = fs.existsSync(path.join(dist, "index.html"));
  nameClientBuild(app, built ? clientEntryOf(fs.readFileSync(path.join(dist, "index.html"), "utf8")) : null);

  mountRawRoutes(app);
  app.use("/api", express.json({ limit: "2mb" }));
  app.use("/api", apiRouter());
  app.use("/api", (_req, res) => sendProblem(res, 404, "not_found", "No such API route."));

  if (built) {
    // The tracking worker runs opencv.js, whose build evaluates generated code. A worker obeys the
    // policy sent with its own script, so only that one file gets 'unsafe-eval'; pages keep theirs.
    app.use("/assets", (req, res, next) => {
      if (/^\/track\.worker-[\w-]+\.js$/.test(req.path)) res.setHeader("Content-Security-Policy", TRACKING_WORKER_CSP);
      next();
    });
    app.use("/assets", express.static(path.join(dist, "assets"), { immutable: true, maxAge: "1y", index: false }));
    app.use(express.static(dist, { index: false, maxAge: "1h" }));
    app.get("/{*splat}", (_req, res) => res.sendFile(path.join(dist, "index.html")));
  }
  // Whatever is left (no page build yet, or a method pages don't take) gets our 404, so it keeps
  // the headers set above: Express's own final handler would replace the page policy with its own.
  app.use((_req, res) =>
    sendProblem(res, 404, "not_found", built ? "No such page." : "The web app is not built yet: run `npx vite build`."),
  );
  app.use(problemHandler);
  return app;
}
