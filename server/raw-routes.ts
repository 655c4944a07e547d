import type { Express } from "express";

/**
 * Routes that must read the raw request stream (resumable uploads), mounted before the JSON
 * body parser. Clip ingest registers the tus endpoint here.
 */
export function mountRawRoutes(_app: Express) {}
