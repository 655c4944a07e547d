import type { QueryClient } from "@tanstack/react-query";
import type { SaveMarksResponse, ShotDetail } from "@shared/schemas/shots";
import { teamKey } from "../team";
import { shotKeys } from "./keys";

const sameKey = (a: readonly unknown[], b: readonly unknown[]) => a.length === b.length && a.every((v, i) => v === b[i]);

/**
 * Shots' numbers changed (marks saved, a shot added or deleted, a calibration, a stiffness, a
 * share): every view of the team's shots refetches — active ones at once, the rest when next
 * shown. `keepDocument` spares the Digitise document that was just written through.
 */
export function shotsChanged(qc: QueryClient, teamId: string, o: { keepDocument?: string } = {}) {
  const keep = o.keepDocument ? shotKeys.document(teamId, o.keepDocument) : null;
  return qc.invalidateQueries({ queryKey: shotKeys.all(teamId), predicate: (q) => !keep || !sameKey(q.queryKey, keep) });
}

/**
 * Who may see shots changed (a shot's player corrected, a clip's player moved): every list of
 * shots, clips and progress depends on it, so every query of the team refetches.
 */
export function shotAccessChanged(qc: QueryClient, teamId: string) {
  return qc.invalidateQueries({ queryKey: teamKey(teamId) });
}

/**
 * The Digitise autosave stored marks: the cached document becomes what the server now holds (so
 * coming back to the shot starts from the latest version), and every other view refetches.
 */
export function shotMarksSaved(qc: QueryClient, teamId: string, shotId: string, saved: Pick<ShotDetail, "marks" | "events">, r: SaveMarksResponse) {
  qc.setQueryData<ShotDetail>(shotKeys.document(teamId, shotId), (d) =>
    d && { ...d, marks: saved.marks, events: saved.events, version: r.version, updatedAt: r.updatedAt, updatedByName: r.updatedByName, storedResult: r.storedResult ?? d.storedResult },
  );
  return shotsChanged(qc, teamId, { keepDocument: shotId });
}
