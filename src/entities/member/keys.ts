import { teamKey } from "../team";

/** The roster page's members and invitations. */
export const memberKeys = {
  roster: (teamId: string) => [...teamKey(teamId), "roster"] as const,
};
