/** All clip queries of a team sit under one key, so one invalidation refreshes the library. */
export const clipsKey = (teamId: string) => ["teams", teamId, "clips"] as const;
export const clipKey = (teamId: string, clipId: string) => [...clipsKey(teamId), "one", clipId] as const;
export const clipOptionsKey = (teamId: string) => ["teams", teamId, "clip-options"] as const;
export const clipPath = (teamId: string, clipId = "") => `/teams/${encodeURIComponent(teamId)}/clips${clipId ? `/${encodeURIComponent(clipId)}` : ""}`;
