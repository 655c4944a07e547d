// The few writes to better-auth's own tables the product makes itself (Drizzle only here).
import { and, eq } from "drizzle-orm";
import { db } from "../../db/client";
import { member, session, user } from "../../db/schema";

export async function markEmailVerified(userId: string) {
  await db().update(user).set({ emailVerified: true }).where(eq(user.id, userId));
}

/** After a reset proved the address of an account nobody had proved before: verified, and the
 * name whoever made the account chose is replaced by the address's own local part. */
export async function claimUnverifiedAccount(userId: string, email: string) {
  const name = email.split("@")[0]!.slice(0, 100) || "Member";
  await db().update(user).set({ emailVerified: true, name }).where(eq(user.id, userId));
}

export async function deleteSessionsOf(userId: string) {
  await db().delete(session).where(eq(session.userId, userId));
}

export async function deleteUser(userId: string) {
  await db().delete(user).where(eq(user.id, userId));
}

/** A team admin of any team (the people who look after the installation see its details). */
export async function isAdminAnywhere(userId: string) {
  const [row] = await db().select({ id: member.id }).from(member).where(and(eq(member.userId, userId), eq(member.role, "admin"))).limit(1);
  return !!row;
}
