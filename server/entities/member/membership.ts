import { and, eq, sql } from "drizzle-orm";
import { db } from "../../db/client";
import { invitation, member, organization, user } from "../../db/schema";
import { recordAudit, type AuditAction } from "../audit/repository";
import { RoleSchema, type Role } from "../../../shared/schemas/roster";

export async function pendingInvitationsOf(teamId: string) {
  return db()
    .select({ id: invitation.id, email: invitation.email, role: invitation.role, status: invitation.status, expiresAt: invitation.expiresAt, invitedBy: user.name })
    .from(invitation)
    .innerJoin(user, eq(user.id, invitation.inviterId))
    .where(and(eq(invitation.organizationId, teamId), eq(invitation.status, "pending")))
    .orderBy(invitation.createdAt);
}

export async function memberByEmail(teamId: string, email: string) {
  const [row] = await db()
    .select({ id: member.id })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.organizationId, teamId), eq(sql`lower(${user.email})`, email.toLowerCase())));
  return row ?? null;
}

type Tx = Parameters<Parameters<ReturnType<typeof db>["transaction"]>[0]>[0];
export type MemberRow = typeof member.$inferSelect;

/**
 * Runs a membership change with every member row of the team locked (SELECT … FOR UPDATE), so two
 * admins demoting or removing each other at once are served one after the other and the second
 * sees the first's result. `change` returns the audit entry, written in the same transaction.
 */
export async function changeMembership<T>(
  teamId: string,
  change: (members: MemberRow[], tx: Tx) => Promise<{ result: T; audit: { actorId: string | null; action: AuditAction; targetType: string; targetId: string; detail: Record<string, unknown> } }>,
): Promise<T> {
  return db().transaction(async (tx) => {
    const members = await tx.select().from(member).where(eq(member.organizationId, teamId)).orderBy(member.id).for("update");
    const { result, audit } = await change(members, tx);
    await recordAudit({ teamId, ...audit }, tx);
    return result;
  });
}

export async function setMemberRole(tx: Tx, memberId: string, role: Role) {
  await tx.update(member).set({ role: RoleSchema.parse(role) }).where(eq(member.id, memberId));
}

export async function deleteMember(tx: Tx, memberId: string) {
  await tx.delete(member).where(eq(member.id, memberId));
}

/**
 * Accepts a pending invitation for `userId` in one transaction: the invitation row is locked, so
 * two clicks on the same link make one member; the second finds it used. Returns null when the
 * invitation is no longer pending.
 */
export async function joinByInvitation(invitationId: string, userId: string, audit: { email: string }) {
  return db().transaction(async (tx) => {
    const [inv] = await tx.select().from(invitation).where(eq(invitation.id, invitationId)).for("update");
    if (!inv || inv.status !== "pending" || inv.expiresAt.getTime() < Date.now()) return null;
    const role = RoleSchema.parse(inv.role);
    const [existing] = await tx.select({ id: member.id }).from(member).where(and(eq(member.organizationId, inv.organizationId), eq(member.userId, userId)));
    if (!existing) await tx.insert(member).values({ id: crypto.randomUUID(), organizationId: inv.organizationId, userId, role, createdAt: new Date() });
    await tx.update(invitation).set({ status: "accepted" }).where(eq(invitation.id, invitationId));
    await recordAudit({ teamId: inv.organizationId, actorId: userId, action: "member.joined", targetType: "invitation", targetId: invitationId, detail: { email: audit.email, role } }, tx);
    return { teamId: inv.organizationId, role };
  });
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
