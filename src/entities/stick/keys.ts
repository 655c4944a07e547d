import { teamKey, teamPath } from "../team";

/** The one query-key tree for sticks: the list (with the alert level) and one stick with its tests. */
export const stickKeys = {
  all: (teamId: string) => [...teamKey(teamId), "sticks"] as const,
  one: (teamId: string, stickId: string) => [...stickKeys.all(teamId), stickId] as const,
};
export const stickPath = (teamId: string, stickId: string) => `${teamPath(teamId)}/sticks/${encodeURIComponent(stickId)}`;
