// Team roles, their labels and one-line meanings come from the shared API schema, so the server
// and the client never disagree about them (meanings follow ../shared/design/VOCABULARY.md).
import { roleDescriptions, roleLabels, roles, type Role } from "@shared/schemas/roster";

export type { Role };
export const ROLES = roles;
export const roleLabel = roleLabels;
export const roleMeaning = roleDescriptions;

/** Staff see the whole team's work; players see their own. */
export const isStaff = (role: Role | undefined) => role === "admin" || role === "coach" || role === "analyst";
