import { useState } from "react";
import { EmptyState, PageHeader, PageSpinner, Select, LoadError } from "@/components/ui";
import { useActiveTeam } from "@/lib/session";
import { useAuditLog } from "../api/auditLog";
import { useMemberNames } from "@/entities/member";
import { AuditTimeline } from "../components/AuditTimeline";
import { describeAudit, groupLabels, namesWithFormer, type AuditGroup } from "../describe";

export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, the team's records show here.</EmptyState>;
  if (team.role !== "admin")
    return (
      <>
        <PageHeader eyebrow={team.name} title="Audit log" />
        <EmptyState title="The audit log is for team admins">
          It records role changes, invitations, deletions and shares. Ask a team admin of {team.name} if you need to know who changed something.
        </EmptyState>
      </>
    );
  return <AdminAudit teamId={team.id} teamName={team.name} />;
}

function AdminAudit({ teamId, teamName }: { teamId: string; teamName: string }) {
  const log = useAuditLog(teamId);
  const names = useMemberNames(teamId);
  const [group, setGroup] = useState<AuditGroup | "all">("all");
  const known = namesWithFormer(log.data ?? [], names.data ?? new Map<string, string>());
  const shown = (log.data ?? []).filter((e) => group === "all" || describeAudit(e, known).group === group);

  return (
    <>
      <PageHeader
        eyebrow={teamName}
        title="Audit log"
        description="Who changed roles, sent or cancelled invitations, deleted clips, shots or sticks, and shared shots — the latest 200 entries."
        actions={
          <label className="flex items-center gap-2 text-sm text-ink-muted">
            Show
            <Select compact value={group} onChange={(ev) => setGroup(ev.target.value as AuditGroup | "all")} aria-label="Show entries of">
              <option value="all">Everything</option>
              {(Object.keys(groupLabels) as AuditGroup[]).map((g) => (
                <option key={g} value={g}>
                  {groupLabels[g]}
                </option>
              ))}
            </Select>
          </label>
        }
      />
      {log.isPending ? (
        <PageSpinner label="Loading the audit log…" />
      ) : log.isError ? (
        <LoadError title="Couldn't load the audit log" error={log.error} onRetry={() => log.refetch()} />
      ) : shown.length === 0 ? (
        <EmptyState title={log.data.length ? "Nothing of this kind yet" : "Nothing recorded yet"}>
          Role changes, invitations, deletions and shares are recorded here as they happen.
        </EmptyState>
      ) : (
        <AuditTimeline entries={shown} names={known} />
      )}
    </>
  );
}
