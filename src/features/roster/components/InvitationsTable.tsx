import { useState } from "react";
import { Badge, Button, Card, ConfirmDialog, Table, TBody, Td, Th, THead, Tr, toast } from "@/components/ui";
import { formatDate, formatRelative } from "@/lib/format";
import { roleLabel } from "@/lib/roles";
import { useCancelInvitation } from "../api/cancelInvitation";
import { useResendInvitation } from "../api/resendInvitation";
import type { Invitation } from "@/entities/member";

const isExpired = (inv: Invitation) => inv.status === "expired" || new Date(inv.expiresAt).getTime() < Date.now();

export function InvitationsTable({ teamId, invitations }: { teamId: string; invitations: Invitation[] }) {
  const resend = useResendInvitation(teamId);
  const cancel = useCancelInvitation(teamId);
  const [cancelling, setCancelling] = useState<Invitation | null>(null);

  return (
    <Card title="Pending invitations" description="People who have been invited but haven't joined yet." flush>
      {invitations.length === 0 ? (
        <p className="px-5 py-6 text-sm text-ink-muted">No invitations waiting. New invitations appear here until the person joins.</p>
      ) : (
        <Table caption="Pending invitations">
          <THead>
            <Tr>
              <Th>E-mail</Th>
              <Th>Role</Th>
              <Th className="hidden md:table-cell">Invited by</Th>
              <Th>Link</Th>
              <Th className="text-right">
                <span className="sr-only">Actions</span>
              </Th>
            </Tr>
          </THead>
          <TBody>
            {invitations.map((inv) => {
              const expired = isExpired(inv);
              return (
                <Tr key={inv.id}>
                  <Td primary className="font-medium break-all">{inv.email}</Td>
                  <Td label="Role">{roleLabel[inv.role] ?? inv.role}</Td>
                  <Td className="hidden text-ink-muted md:table-cell">{inv.invitedBy}</Td>
                  <Td label="Expires">
                    {expired ? (
                      <Badge tone="danger">Expired</Badge>
                    ) : (
                      <span className="text-ink-muted" title={`Valid until ${formatDate(inv.expiresAt)}`}>
                        Expires {formatRelative(inv.expiresAt)}
                      </span>
                    )}
                  </Td>
                  <Td data-actions className="text-right whitespace-nowrap">
                    <Button
                      variant="ghost"
                      size="sm"
                      loading={resend.isPending && resend.variables === inv.id}
                      onClick={() => resend.mutate(inv.id, { onSuccess: () => toast.success(`A fresh link is on its way to ${inv.email}.`, "Invitation sent again") })}
                    >
                      Resend
                    </Button>
                    <Button variant="ghost-danger" size="sm" onClick={() => setCancelling(inv)}>
                      Cancel
                    </Button>
                  </Td>
                </Tr>
              );
            })}
          </TBody>
        </Table>
      )}
      <ConfirmDialog
        open={cancelling !== null}
        title={`Cancel the invitation to ${cancelling?.email ?? ""}?`}
        description="The link in their e-mail stops working. You can invite them again later."
        confirmLabel="Cancel invitation"
        cancelLabel="Keep it"
        pending={cancel.isPending}
        onCancel={() => setCancelling(null)}
        onConfirm={() => {
          if (!cancelling) return;
          const inv = cancelling;
          cancel.mutate(inv.id, {
            onSuccess: () => toast.success(`The link sent to ${inv.email} no longer works.`, "Invitation cancelled"),
            onSettled: () => setCancelling(null),
          });
        }}
      />
    </Card>
  );
}
