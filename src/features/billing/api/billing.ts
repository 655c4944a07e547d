import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiGet, apiPost, apiPut } from "@/lib/api";
import { meKey } from "@/lib/session";
import type { BillingStatus, Invoice, PlanChangePreview } from "@shared/schemas/billing";
import type { PlanId } from "@shared/billing/plans";

// /api/teams/:teamId/billing… — the club's plan as every member sees it, and the admin's actions.
// The plan itself changes only when the payment service's webhook arrives, so after an action the
// status is asked again until it shows the change (BillingPage).
export const billingKey = (teamId: string) => ["billing", teamId] as const;
const base = (teamId: string) => `/teams/${encodeURIComponent(teamId)}`;

export const billingQueryOptions = (teamId: string) =>
  queryOptions({ queryKey: billingKey(teamId), queryFn: ({ signal }) => apiGet<BillingStatus>(`${base(teamId)}/billing`, undefined, signal) });

/** Polls every second while `waiting` (after checkout or a change, until the webhook lands). */
export const useBilling = (teamId: string, waiting = false) =>
  useQuery({ ...billingQueryOptions(teamId), enabled: !!teamId, refetchInterval: waiting ? 1000 : false });

export const useInvoices = (teamId: string, enabled: boolean) =>
  useQuery({
    queryKey: [...billingKey(teamId), "invoices"],
    queryFn: ({ signal }) => apiGet<{ invoices: Invoice[] }>(`${base(teamId)}/billing/invoices`, undefined, signal).then((r) => r.invoices),
    enabled,
  });

export const useCheckout = (teamId: string) =>
  useMutation({
    mutationFn: (plan: PlanId) => apiPost<{ url: string }>(`${base(teamId)}/billing/checkout`, { plan }),
    // Off to the payment page: the browser leaves the app.
    onSuccess: ({ url }) => window.location.assign(url),
  });

export const usePlanPreview = (teamId: string) =>
  useMutation({ mutationFn: (plan: PlanId) => apiPost<PlanChangePreview>(`${base(teamId)}/billing/plan/preview`, { plan }) });

function useBillingAction<V>(teamId: string, call: (v: V) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: call, onSuccess: () => qc.invalidateQueries({ queryKey: billingKey(teamId) }) });
}

export const useChangePlan = (teamId: string) => useBillingAction(teamId, (plan: PlanId) => apiPut(`${base(teamId)}/billing/plan`, { plan }));
export const useCancelAtPeriodEnd = (teamId: string) =>
  useBillingAction(teamId, (cancel: boolean) => apiPost(`${base(teamId)}/billing/${cancel ? "cancel" : "resume"}`));

export function useAddTeam(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => apiPost<{ id: string; name: string }>(`${base(teamId)}/club/teams`, { name }),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: billingKey(teamId) }), qc.invalidateQueries({ queryKey: meKey })]),
  });
}
