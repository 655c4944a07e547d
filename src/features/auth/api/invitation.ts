import { queryOptions, useQuery } from "@tanstack/react-query";
import { apiGet } from "@/lib/api";
import type { InvitationPublic } from "@shared/schemas/roster";

/** GET /api/invitations/:id (no sign-in needed). */
export type { InvitationPublic as InvitationView } from "@shared/schemas/roster";

export const fetchInvitation = (id: string, signal?: AbortSignal) => apiGet<InvitationPublic>(`/invitations/${encodeURIComponent(id)}`, undefined, signal);

export const invitationQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ["invitations", id],
    queryFn: ({ signal }) => fetchInvitation(id, signal),
    meta: { toast: false, authRedirect: false },
  });

export const useInvitation = (id: string) => useQuery(invitationQueryOptions(id));
