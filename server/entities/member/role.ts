// A team member as the rest of the server sees them: who (user), where (team) and in which role.
// Role parsing and "is this person staff" are said here once; server/auth/policy.ts builds on it.
import { parseRole, type Role } from "../../../shared/schemas/roster";

export { parseRole };
export type { Role };

/** The signed-in person acting in one team. */
export interface Actor {
  userId: string;
  teamId: string;
  role: Role;
}

const STAFF: readonly Role[] = ["admin", "coach", "analyst"];

/** Staff (team admin, coach, analyst) see the whole team's work; players see their own. */
export const isStaffRole = (role: Role) => STAFF.includes(role);
export const isStaff = (a: Pick<Actor, "role">) => isStaffRole(a.role);

/** A stored role for lists: unknown roles show as the least one (see parseRole). */
export const roleForList = (stored: string | null | undefined): Role => parseRole(stored) ?? "player";
