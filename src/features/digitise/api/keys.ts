/** Query keys of this area: one shot, and the shots of one clip. */
export const shotKey = (teamId: string, shotId: string) => ["teams", teamId, "shots", shotId] as const;
export const clipShotsKey = (teamId: string, clipId: string) => ["teams", teamId, "clips", clipId, "shots"] as const;

export const teamPath = (teamId: string) => `/teams/${encodeURIComponent(teamId)}`;
