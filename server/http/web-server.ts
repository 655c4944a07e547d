import { createServer, type RequestListener, type Server } from "node:http";

/**
 * How long an idle kept-alive connection stays open. Longer than any proxy in front keeps an idle
 * connection to us: Caddy's reverse proxy (docker/Caddyfile) reuses them for 2 minutes by default
 * (its HTTP transport's IdleConnTimeout). With Node's default of 5 s the app closed connections the
 * proxy still counted as open, and a request the proxy sent into one as it closed failed
 * (decision 179). Clients that read the Keep-Alive hint (Node's own agent) close theirs 1 s early.
 */
export const KEEP_ALIVE_MS = 130_000;

/** The HTTP server of a web process, with the time limits every web process uses. */
export function createWebServer(app: RequestListener): Server {
  const server = createServer(app);
  server.requestTimeout = 0; // large resumable uploads; each chunk is bounded by tus itself
  server.headersTimeout = 60_000;
  server.keepAliveTimeout = KEEP_ALIVE_MS;
  return server;
}
