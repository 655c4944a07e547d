import type { QueryClient } from "@tanstack/react-query";
import { shotsChanged } from "../shot/invalidate";
import { stickKeys } from "./keys";

/**
 * A stick changed (a bench test added or removed, its rating, the stick deleted, the alert
 * level): the stick lab refetches, and so does every view of shots — the stiffness in force
 * changes stored energy and the beam from a shot (docs/decisions/122-stiffness-in-force.md).
 */
export function stickChanged(qc: QueryClient, teamId: string) {
  return Promise.all([qc.invalidateQueries({ queryKey: stickKeys.all(teamId) }), shotsChanged(qc, teamId)]);
}
