import { Router } from "express";
import { actorOf, signedInOf } from "../auth/context";
import { parse } from "../http/validate";
import { ChoosePlanSchema, NewTeamSchema } from "../../shared/schemas/billing";
import * as svc from "./service";

/** Mounted at /api/teams/:teamId (after requireTeamMember). Writes here stay open while the club is
 * read-only for non-payment: paying must always be possible (read-only-guard.ts). */
export const billingRouter = Router({ mergeParams: true });
billingRouter.get("/billing", async (req, res) => void res.json(await svc.status(actorOf(req))));
billingRouter.get("/billing/invoices", async (req, res) => void res.json({ invoices: await svc.invoices(actorOf(req)) }));
billingRouter.post("/billing/checkout", async (req, res) => {
  const { plan } = parse(ChoosePlanSchema, req.body);
  res.status(201).json(await svc.checkout(actorOf(req), plan, signedInOf(req).user.email));
});
billingRouter.post("/billing/plan/preview", async (req, res) => void res.json(await svc.previewChange(actorOf(req), parse(ChoosePlanSchema, req.body).plan)));
billingRouter.put("/billing/plan", async (req, res) => void res.status(202).json(await svc.changePlan(actorOf(req), parse(ChoosePlanSchema, req.body).plan)));
billingRouter.post("/billing/cancel", async (req, res) => void res.status(202).json(await svc.setCancelAtPeriodEnd(actorOf(req), true)));
billingRouter.post("/billing/resume", async (req, res) => void res.status(202).json(await svc.setCancelAtPeriodEnd(actorOf(req), false)));
billingRouter.post("/club/teams", async (req, res) => void res.status(201).json(await svc.addTeam(actorOf(req), parse(NewTeamSchema, req.body).name)));
