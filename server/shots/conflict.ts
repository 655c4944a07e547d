import { HttpError } from "../http/problem";
import type { VersionConflict } from "../../shared/schemas/shots";

/**
 * 409 version_conflict: someone saved the shot after the caller's edits began. It carries who saved
 * last and when as problem+json extension members (RFC 9457 §3.2), so the page can say so; the
 * one problem handler writes it like every other error.
 */
export class VersionConflictError extends HttpError {
  constructor(readonly conflict: VersionConflict) {
    const who = conflict.savedBy ?? "Someone";
    super(409, "version_conflict", `${who} saved this shot at ${conflict.savedAt} (now version ${conflict.currentVersion}); your edits were not saved, so nothing was overwritten.`, undefined, { ...conflict });
  }
}
