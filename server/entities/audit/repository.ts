import { and, desc, eq } from "drizzle-orm";
import { db } from "../../db/client";
import { auditLog, user } from "../../db/schema";

export type AuditAction =
  | "member.role_changed" | "member.removed" | "member.joined"
  | "invitation.created" | "invitation.resent" | "invitation.cancelled"
  | "clip.deleted" | "clip.player_changed" | "shot.deleted" | "shot.reassigned" | "shot.shared" | "shot.unshared" | "shot.published" | "shot.unpublished" | "stick.deleted" | "bench_test.deleted"
  | "plan.changed" | "plan.cancel_scheduled" | "plan.cancel_withdrawn" | "billing.payment_failed" | "billing.read_only" | "billing.restored"
  | "team.created";

type Executor = Pick<ReturnType<typeof db>, "insert">;

export interface AuditEntry { teamId: string; actorId: string | null; action: AuditAction; targetType: string; targetId?: string; detail?: Record<string, unknown> }

/** Pass the transaction as `executor` when the change and its entry must land together. */
export async function recordAudit(e: AuditEntry, executor: Executor = db()) {
  await executor.insert(auditLog).values({ ...e, detail: e.detail ?? {} });
}

export async function listAudit(teamId: string, limit = 200) {
  return db()
    .select({ id: auditLog.id, action: auditLog.action, targetType: auditLog.targetType, targetId: auditLog.targetId, detail: auditLog.detail, createdAt: auditLog.createdAt, actorName: user.name })
    .from(auditLog)
    .leftJoin(user, eq(user.id, auditLog.actorId))
    .where(eq(auditLog.teamId, teamId))
    .orderBy(desc(auditLog.createdAt))
    .limit(limit);
}

/** When and by whom the latest `action` on this target of the team happened; null if never. */
export async function latestAuditEntry(teamId: string, action: AuditAction, targetId: string) {
  const [row] = await db()
    .select({ at: auditLog.createdAt, byName: user.name })
    .from(auditLog)
    .leftJoin(user, eq(user.id, auditLog.actorId))
    .where(and(eq(auditLog.teamId, teamId), eq(auditLog.action, action), eq(auditLog.targetId, targetId)))
    .orderBy(desc(auditLog.createdAt))
    .limit(1);
  return row ?? null;
}
