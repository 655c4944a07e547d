import { useState } from "react";
import { Badge, Button, Card, ConfirmDialog, Table, TBody, Td, Th, THead, Tr, toast } from "@/components/ui";
import { formatDate } from "@/lib/format";
import { ROLES, roleLabel, type Role } from "@/lib/roles";
import { useChangeRole } from "../api/changeRole";
import { useRemoveMember } from "../api/removeMember";
import type { Member } from "@/entities/member";
import { RoleSelect } from "./RoleSelect";

interface Props {
  teamId: string;
  teamName: string;
  members: Member[];
  myUserId: string;
}

type Pending = { kind: "remove"; member: Member } | { kind: "demote"; member: Member; role: Role } | null;

const byRoleThenName = (a: Member, b: Member) => ROLES.indexOf(a.role) - ROLES.indexOf(b.role) || a.name.localeCompare(b.name);

export function MembersTable({ teamId, teamName, members, myUserId }: Props) {
  const changeRole = useChangeRole(teamId);
  const remove = useRemoveMember(teamId);
  const [pending, setPending] = useState<Pending>(null);

  const applyRole = (member: Member, role: Role) =>
    changeRole.mutate(
      { memberId: member.id, role },
      {
        onSuccess: () => toast.success(`${member.name}'s role is now ${roleLabel[role]}.`, "Role changed"),
        onSettled: () => setPending(null),
      },
    );

  const onRoleChange = (member: Member, role: Role) => {
    if (role === member.role) return;
    // Taking admin rights away is the change people regret, so it asks first.
    if (member.role === "admin") setPending({ kind: "demote", member, role });
    else applyRole(member, role);
  };

  return (
    <Card title="Members" description={`${members.length} ${members.length === 1 ? "person" : "people"} in ${teamName}`} flush>
      <Table caption={`Members of ${teamName}`}>
        <THead>
          <Tr>
            <Th>Name</Th>
            <Th className="w-48">Role</Th>
            <Th className="hidden md:table-cell">Joined</Th>
            <Th className="text-right">
              <span className="sr-only">Actions</span>
            </Th>
          </Tr>
        </THead>
        <TBody>
          {[...members].sort(byRoleThenName).map((m) => {
            const me = m.userId === myUserId;
            const busy = changeRole.isPending && changeRole.variables?.memberId === m.id;
            return (
              <Tr key={m.id}>
                <Td primary>
                  <div className="flex items-center gap-2 font-medium">
                    {m.name}
                    {me && <Badge tone="accent">You</Badge>}
                  </div>
                  <div className="text-ink-muted">{m.email}</div>
                </Td>
                <Td label="Role">
                  <RoleSelect
                    compact
                    className="min-w-36"
                    aria-label={`Role of ${m.name}`}
                    value={busy ? changeRole.variables!.role : m.role}
                    disabled={me || busy}
                    title={me ? "Another team admin can change your role" : undefined}
                    onChange={(e) => onRoleChange(m, e.target.value as Role)}
                  />
                </Td>
                <Td className="hidden text-ink-muted md:table-cell">{formatDate(m.joinedAt)}</Td>
                <Td className="text-right">
                  {me ? null : (
                    <Button variant="ghost-danger" size="sm" onClick={() => setPending({ kind: "remove", member: m })}>
                      Remove
                    </Button>
                  )}
                </Td>
              </Tr>
            );
          })}
        </TBody>
      </Table>

      <ConfirmDialog
        open={pending?.kind === "remove"}
        title={pending?.kind === "remove" ? `Remove ${pending.member.name} from ${teamName}?` : ""}
        description="They lose access to this team's clips, shots and sticks straight away. You can invite them again later."
        confirmLabel="Remove member"
        pending={remove.isPending}
        onCancel={() => setPending(null)}
        onConfirm={() => {
          if (pending?.kind !== "remove") return;
          const { member } = pending;
          remove.mutate(member.id, {
            onSuccess: () => toast.success(`${member.name} no longer has access to ${teamName}.`, "Member removed"),
            onSettled: () => setPending(null),
          });
        }}
      />
      <ConfirmDialog
        open={pending?.kind === "demote"}
        tone="primary"
        title={pending?.kind === "demote" ? `Change ${pending.member.name}'s role to ${roleLabel[pending.role]}?` : ""}
        description="They will no longer manage members, roles or invitations for this team."
        confirmLabel="Change role"
        pending={changeRole.isPending}
        onCancel={() => setPending(null)}
        onConfirm={() => pending?.kind === "demote" && applyRole(pending.member, pending.role)}
      />
    </Card>
  );
}
