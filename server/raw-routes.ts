import type { Express } from "express";
import { mountUploads } from "./clips/uploads";
import { mountBillingWebhook } from "./billing/webhook";
import { ensureClipSweepScheduled } from "./jobs/clip-queue";
import { queue } from "./jobs/runtime";

/**
 * Routes that must read the raw request stream (resumable uploads), mounted before the JSON
 * body parser. Clip ingest registers the tus endpoint here.
 */
export function mountRawRoutes(app: Express) {
  mountUploads(app);
  mountBillingWebhook(app);
  // Once this process has started the queue, make sure the clip repair sweep is scheduled.
  setTimeout(() => {
    try {
      queue();
    } catch {
      return; // no queue in this process (tests, scripts)
    }
    void ensureClipSweepScheduled();
  }, 5_000).unref();
}
