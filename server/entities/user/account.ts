// People's accounts (better-auth's user and session tables): the few writes the product makes
// itself, and who has an address or what a person is called.
import { eq, sql } from "drizzle-orm";
import { db } from "../../db/client";
import { session, user } from "../../db/schema";

type Executor = Pick<ReturnType<typeof db>, "select">;

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

/** The account with this e-mail address (any case), or null. */
export async function userIdByEmail(email: string) {
  const [row] = await db().select({ id: user.id }).from(user).where(eq(sql`lower(${user.email})`, email.toLowerCase()));
  return row?.id ?? null;
}

/** A person's name and e-mail; pass the transaction when read inside a change. */
export async function userContact(userId: string, executor: Executor = db()) {
  const [row] = await executor.select({ name: user.name, email: user.email }).from(user).where(eq(user.id, userId));
  return row ?? null;
}
