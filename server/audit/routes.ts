import { Router } from "express";
import { actorOf } from "../auth/context";
import { policy } from "../auth/policy";
import { forbidden } from "../http/problem";
import { listAudit } from "../entities/audit/repository";

export const auditRouter = Router({ mergeParams: true });
auditRouter.get("/audit", async (req, res) => {
  const a = actorOf(req);
  if (!policy.viewAuditLog(a)) throw forbidden("Only a team admin can read the audit log.");
  res.json({ entries: await listAudit(a.teamId) });
});
