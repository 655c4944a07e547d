/** Stick lab queries live under one key per team, so a bench test refreshes the list and the stick at once. */
export const sticksKey = (teamId: string) => ["teams", teamId, "sticks"] as const;
export const stickKey = (teamId: string, stickId: string) => [...sticksKey(teamId), stickId] as const;
export const shotBeamKey = (teamId: string, shotId: string) => ["teams", teamId, "beam", "shots", shotId] as const;

export const teamPath = (teamId: string) => `/teams/${encodeURIComponent(teamId)}`;
export const stickPath = (teamId: string, stickId: string) => `${teamPath(teamId)}/sticks/${encodeURIComponent(stickId)}`;
