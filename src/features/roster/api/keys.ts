/** Everything on the roster page lives under one key per team, so one invalidation refreshes it. */
export const rosterKey = (teamId: string) => ["teams", teamId, "roster"] as const;
