import { z } from "zod";
import { PLAN_IDS } from "../billing/plans";

export const PlanIdSchema = z.enum(PLAN_IDS);

export const BillingStatusSchema = z.object({
  club: z.object({ id: z.string(), name: z.string() }),
  plan: PlanIdSchema,
  access: z.enum(["ok", "grace", "read_only"]),
  graceEndsAt: z.string().nullable(),
  subscription: z.object({ status: z.string(), currentPeriodEnd: z.string().nullable(), cancelAtPeriodEnd: z.boolean() }).nullable(),
  usage: z.object({ storageBytes: z.number(), staffSeats: z.number(), teams: z.number() }),
  /** The caller may choose plans, pay and see invoices (a team admin). */
  canManage: z.boolean(),
  /** Checkout is configured on this server. */
  paymentsEnabled: z.boolean(),
});
export type BillingStatus = z.infer<typeof BillingStatusSchema>;

export const InvoiceSchema = z.object({
  id: z.string(),
  number: z.string().nullable(),
  status: z.string(),
  reason: z.string().nullable(),
  totalCents: z.number(),
  amountDueCents: z.number(),
  amountPaidCents: z.number(),
  currency: z.string(),
  createdAt: z.string(),
  periodStart: z.string().nullable(),
  periodEnd: z.string().nullable(),
  /** The service's page to see (or pay) it. */
  url: z.string().nullable(),
});
export type Invoice = z.infer<typeof InvoiceSchema>;

export const ChoosePlanSchema = z.object({ plan: PlanIdSchema });
export const NewTeamSchema = z.object({ name: z.string().trim().min(2, "Give the team a name of at least 2 characters").max(80) });

export const PlanChangePreviewSchema = z.object({ plan: PlanIdSchema, amountDueCents: z.number(), totalCents: z.number(), currency: z.string() });
export type PlanChangePreview = z.infer<typeof PlanChangePreviewSchema>;
