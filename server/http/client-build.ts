import type { Express } from "express";
import { CLIENT_BUILD_HEADER } from "../../shared/client-build";

// The page build the server serves, named on /api/me answers so a tab left open across an update
// learns it runs an older one (src/lib/client-build.ts, decision 203). Only /api/me carries it: the
// tab asks for it on load and when it comes back into focus, and no hot read pays for the header.

/** The built index.html's entry script ("/assets/index-<hash>.js"), which changes with every build. */
export function clientEntryOf(indexHtml: string): string | null {
  return /<script\b[^>]*\btype="module"[^>]*\bsrc="(\/assets\/[^"]+\.js)"/.exec(indexHtml)?.[1] ?? null;
}

export function nameClientBuild(app: Express, entry: string | null) {
  if (!entry) return;
  app.get("/api/me", (_req, res, next) => {
    res.setHeader(CLIENT_BUILD_HEADER, entry);
    next();
  });
}
