// Team members: who belongs to a team and in which role. Every query names the team.
import { and, asc, eq, sql } from "drizzle-orm";
import { db } from "../../db/client";
import { prepared } from "../../db/prepared";
import { member, organization, user } from "../../db/schema";
import { parseRole, roleForList, type Role } from "./role";

// Asked on every team request (docs/decisions/106-hot-path-queries.md).
const roleQuery = prepared("role_in", (name) =>
  db().select({ role: member.role }).from(member).where(and(eq(member.userId, sql.placeholder("userId")), eq(member.organizationId, sql.placeholder("teamId")))).prepare(name),
);

/**
 * The stored role of the viewer (placeholder `viewerId`) in the team (placeholder `teamId`), as a
 * value inside a hot read's own statement, so the membership check and the read are one round
 * trip (docs/decisions/195-hot-reads-in-one-statement.md). Parse it with parseRole, as roleIn does.
 */
export const viewerStoredRole = sql<string | null>`(select ${member.role} from ${member} where ${member.userId} = ${sql.placeholder("viewerId")} and ${member.organizationId} = ${sql.placeholder("teamId")})`;

/** Role of a user in a team, or null when not a member or the stored role is unknown (no access). */
export async function roleIn(userId: string, teamId: string): Promise<Role | null> {
  const [row] = await roleQuery().execute({ userId, teamId });
  return row ? parseRole(row.role) : null;
}

export async function isMember(teamId: string, userId: string) {
  return (await roleIn(userId, teamId)) !== null;
}

export async function isPlayerOf(teamId: string, userId: string) {
  return (await roleIn(userId, teamId)) === "player";
}

/** Members of the team with their role and contact, by name. */
export async function teamMembers(teamId: string) {
  const rows = await db()
    .select({ id: member.id, userId: member.userId, name: user.name, email: user.email, role: member.role, joinedAt: member.createdAt })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(eq(member.organizationId, teamId))
    .orderBy(asc(user.name));
  return rows.map((r) => ({ ...r, role: roleForList(r.role) }));
}

/** Members whose role is player (the people whose shots a clip or stick can hold), by name. */
export async function playersOf(teamId: string) {
  return (await teamMembers(teamId)).filter((m) => m.role === "player").map((m) => ({ id: m.userId, name: m.name }));
}

/** The teams a person belongs to, with their stored role, by team name. */
export async function teamsOf(userId: string) {
  return db()
    .select({ id: organization.id, name: organization.name, slug: organization.slug, role: member.role })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(eq(member.userId, userId))
    .orderBy(organization.name);
}

/** A team admin of any team (the people who look after the installation see its details). */
export async function isAdminAnywhere(userId: string) {
  const [row] = await db().select({ id: member.id }).from(member).where(and(eq(member.userId, userId), eq(member.role, "admin"))).limit(1);
  return !!row;
}
