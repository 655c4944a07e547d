import { teamKey } from "../team";

/**
 * The one query-key tree for shots. Every query that shows a shot or its numbers — the Digitise
 * document, a clip's shots, the readout, the Shots list, side by side, progress, the beam from a
 * shot — sits under `all(teamId)`, so "shots changed" is one invalidation (./invalidate.ts).
 */
export const shotKeys = {
  all: (teamId: string) => [...teamKey(teamId), "shots"] as const,
  /** The Digitise page's working document (marks, events, version, the clip's calibration). */
  document: (teamId: string, shotId: string) => [...shotKeys.all(teamId), "document", shotId] as const,
  ofClip: (teamId: string, clipId: string) => [...shotKeys.all(teamId), "of-clip", clipId] as const,
  readout: (teamId: string, shotId: string) => [...shotKeys.all(teamId), "readout", shotId] as const,
  /** The Shots list (and side by side's choices): one page of a filter. */
  list: (teamId: string, filters: object) => [...shotKeys.all(teamId), "list", filters] as const,
  compare: (teamId: string, a: string, b: string) => [...shotKeys.all(teamId), "compare", a, b] as const,
  progress: (teamId: string, q: object) => [...shotKeys.all(teamId), "progress", q] as const,
  players: (teamId: string) => [...shotKeys.all(teamId), "players"] as const,
  beam: (teamId: string, shotId: string) => [...shotKeys.all(teamId), "beam", shotId] as const,
  /** The Home page: its tasks and items are mostly shots (waiting for review, latest results,
   * shared with me), so it refreshes with them. */
  home: (teamId: string) => [...shotKeys.all(teamId), "home"] as const,
  /** The team's review setting (auto-publish); outside `all`, it is no shot's number. */
  reviewSettings: (teamId: string) => [...teamKey(teamId), "review-settings"] as const,
  /** A shot's auto-digitise run: outside `all` on purpose — saving marks does not change it. */
  tracking: (teamId: string, shotId: string) => [...teamKey(teamId), "shot-tracking", shotId] as const,
};
