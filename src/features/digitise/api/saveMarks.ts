import { env } from "@/lib/env";
import type { ClipCalibration, SaveMarksBody, SaveMarksResponse, VersionConflict } from "@shared/schemas/shots";
import { SaveError } from "../model/autosave";
import { teamPath } from "@/entities/team";

// The autosave's two calls. Plain fetch rather than src/lib/api: a 409 carries who saved last as
// extension members, and a save sent while the tab closes needs `keepalive`.

async function put(path: string, body: unknown, keepalive = false): Promise<unknown> {
  let res: Response;
  try {
    res = await fetch(`${env.apiBase}${path}`, {
      method: "PUT",
      headers: { "Content-Type": "application/json", Accept: "application/json, application/problem+json" },
      body: JSON.stringify(body),
      credentials: "same-origin",
      keepalive,
    });
  } catch {
    throw new SaveError({ kind: "network" });
  }
  const problem = res.ok ? null : ((await res.json().catch(() => ({}))) as Partial<VersionConflict> & { code?: string; detail?: string });
  if (res.ok) return res.json();
  if (res.status === 409 && problem?.code === "version_conflict")
    throw new SaveError({ kind: "conflict", conflict: { currentVersion: problem.currentVersion ?? 0, savedBy: problem.savedBy ?? null, savedAt: problem.savedAt ?? "" } });
  if (res.status >= 500 || res.status === 429 || res.status === 0) throw new SaveError({ kind: "server", message: problem?.detail ?? `The server answered ${res.status}.` });
  if (res.status === 401) throw new SaveError({ kind: "server", message: "Your sign-in ended; sign in again (your edits are kept on this computer)." });
  throw new SaveError({ kind: "refused", message: problem?.detail ?? `The server refused the save (${res.status}).` });
}

/** PUT /api/teams/:teamId/shots/:shotId/marks with the version the edits started from. */
export const saveMarks = (teamId: string, shotId: string, body: SaveMarksBody, opts: { keepalive?: boolean } = {}) =>
  put(`${teamPath(teamId)}/shots/${encodeURIComponent(shotId)}/marks`, body, opts.keepalive) as Promise<SaveMarksResponse>;

/** PUT /api/teams/:teamId/clips/:clipId/calibration (null clears it). */
export const saveCalibration = (teamId: string, clipId: string, calibration: ClipCalibration | null) =>
  put(`${teamPath(teamId)}/clips/${encodeURIComponent(clipId)}/calibration`, { calibration });
