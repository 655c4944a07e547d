import { teamKey, teamPath } from "../team";

/** The one query-key tree for clips: the library's pages, one clip, and the upload form's choices. */
export const clipKeys = {
  all: (teamId: string) => [...teamKey(teamId), "clips"] as const,
  one: (teamId: string, clipId: string) => [...clipKeys.all(teamId), "one", clipId] as const,
  options: (teamId: string) => [...teamKey(teamId), "clip-options"] as const,
};
export const clipPath = (teamId: string, clipId = "") => `${teamPath(teamId)}/clips${clipId ? `/${encodeURIComponent(clipId)}` : ""}`;
