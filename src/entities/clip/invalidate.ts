import type { QueryClient } from "@tanstack/react-query";
import { shotAccessChanged, shotsChanged } from "../shot/invalidate";
import { clipKeys } from "./keys";

/**
 * A clip changed (its details, player, calibration, status, or it was deleted): the library
 * refetches, and so does every view of shots (a clip's calibration and player are its shots').
 * `access`: who may see the clip changed (a new player), so every query of the team refetches.
 */
export function clipChanged(qc: QueryClient, teamId: string, o: { options?: boolean; access?: boolean } = {}) {
  if (o.access) return shotAccessChanged(qc, teamId);
  return Promise.all([
    qc.invalidateQueries({ queryKey: clipKeys.all(teamId) }),
    o.options ? qc.invalidateQueries({ queryKey: clipKeys.options(teamId) }) : null,
    shotsChanged(qc, teamId),
  ]);
}
