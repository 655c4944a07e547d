import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements } from "better-auth/plugins/organization/access";

// Team roles (shared/design/VOCABULARY.md). better-auth enforces its own member/invitation
// permissions with these; every other decision goes through server/auth/policy.ts.
export const ac = createAccessControl(defaultStatements);

export const admin = ac.newRole({
  organization: ["update"],
  member: ["create", "update", "delete"],
  invitation: ["create", "cancel"],
});
export const coach = ac.newRole({ organization: [], member: [], invitation: [] });
export const analyst = ac.newRole({ organization: [], member: [], invitation: [] });
export const player = ac.newRole({ organization: [], member: [], invitation: [] });

export const roles = { admin, coach, analyst, player };
