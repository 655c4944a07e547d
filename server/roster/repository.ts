import { and, eq, sql } from "drizzle-orm";
import { db } from "../db/client";
import { invitation, member, organization, user } from "../db/schema";

export async function membersOf(teamId: string) {
  return db()
    .select({ id: member.id, userId: member.userId, name: user.name, email: user.email, role: member.role, joinedAt: member.createdAt })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(eq(member.organizationId, teamId))
    .orderBy(user.name);
}

export async function pendingInvitationsOf(teamId: string) {
  return db()
    .select({ id: invitation.id, email: invitation.email, role: invitation.role, status: invitation.status, expiresAt: invitation.expiresAt, invitedBy: user.name })
    .from(invitation)
    .innerJoin(user, eq(user.id, invitation.inviterId))
    .where(and(eq(invitation.organizationId, teamId), eq(invitation.status, "pending")))
    .orderBy(invitation.createdAt);
}

export async function memberById(teamId: string, memberId: string) {
  const [row] = await db().select().from(member).where(and(eq(member.id, memberId), eq(member.organizationId, teamId)));
  return row ?? null;
}

export async function memberByEmail(teamId: string, email: string) {
  const [row] = await db()
    .select({ id: member.id })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.organizationId, teamId), eq(sql`lower(${user.email})`, email.toLowerCase())));
  return row ?? null;
}

export async function adminCount(teamId: string) {
  const [row] = await db()
    .select({ n: sql<number>`count(*)::int` })
    .from(member)
    .where(and(eq(member.organizationId, teamId), eq(member.role, "admin")));
  return row?.n ?? 0;
}

export async function invitationById(id: string) {
  const [row] = await db()
    .select({
      id: invitation.id, teamId: invitation.organizationId, email: invitation.email, role: invitation.role, status: invitation.status,
      expiresAt: invitation.expiresAt, teamName: organization.name, inviterName: user.name,
    })
    .from(invitation)
    .innerJoin(organization, eq(organization.id, invitation.organizationId))
    .innerJoin(user, eq(user.id, invitation.inviterId))
    .where(eq(invitation.id, id));
  return row ?? null;
}

export async function pendingInvitationFor(teamId: string, email: string) {
  const [row] = await db()
    .select({ id: invitation.id })
    .from(invitation)
    .where(and(eq(invitation.organizationId, teamId), eq(sql`lower(${invitation.email})`, email.toLowerCase()), eq(invitation.status, "pending")));
  return row ?? null;
}

export async function userExists(email: string) {
  const [row] = await db().select({ id: user.id }).from(user).where(eq(sql`lower(${user.email})`, email.toLowerCase()));
  return !!row;
}

export async function emailOfUser(userId: string): Promise<string> {
  const [row] = await db().select({ email: user.email }).from(user).where(eq(user.id, userId));
  return row?.email ?? "";
}
