/** Everything of the readout area lives under one key per team, so a share or a team switch refreshes it all. */
export const readoutKey = (teamId: string) => ["teams", teamId, "readout"] as const;
export const shotsKey = (teamId: string, filters: object) => [...readoutKey(teamId), "shots", filters] as const;
export const shotReadoutKey = (teamId: string, shotId: string) => [...readoutKey(teamId), "shot", shotId] as const;
