// Every query of a team sits under ["teams", teamId]; each entity owns one branch of that tree.
export const teamKey = (teamId: string) => ["teams", teamId] as const;
export const teamPath = (teamId: string) => `/teams/${encodeURIComponent(teamId)}`;
