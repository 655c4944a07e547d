import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { db } from "../../db/client";
import { signupRequest } from "../../db/schema";

export async function createRequest(email: string, tokenHash: string, expiresAt: Date) {
  await db().insert(signupRequest).values({ email, tokenHash, expiresAt });
}

/** Requests for this address in the last hour (to bound the mail one address can be sent). */
export async function recentRequests(email: string) {
  const [row] = await db().select({ n: sql<number>`count(*)::int` }).from(signupRequest)
    .where(and(eq(signupRequest.email, email), gt(signupRequest.createdAt, sql`now() - interval '1 hour'`)));
  return row?.n ?? 0;
}

export async function requestByHash(tokenHash: string) {
  const [row] = await db().select().from(signupRequest).where(eq(signupRequest.tokenHash, tokenHash));
  return row ?? null;
}

/** Marks the request used; false when it was used (or expired) meanwhile. */
export async function consumeRequest(id: string) {
  const rows = await db().update(signupRequest).set({ usedAt: new Date() })
    .where(and(eq(signupRequest.id, id), isNull(signupRequest.usedAt), gt(signupRequest.expiresAt, new Date()))).returning({ id: signupRequest.id });
  return rows.length > 0;
}
