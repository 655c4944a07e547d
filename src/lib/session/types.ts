// Shapes of GET /api/me, as the server declares them.
export type { MeResponse as Me, TeamSummary as TeamMembership, Prefs } from "@shared/schemas/roster";
