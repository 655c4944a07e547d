import { EmptyState, PageHeader, PageSpinner, LoadError } from "@/components/ui";
import { useActiveTeam, useSession } from "@/lib/session";
import { useRoster } from "@/entities/member";
import { InvitationsTable } from "../components/InvitationsTable";
import { InviteForm } from "../components/InviteForm";
import { MembersTable } from "../components/MembersTable";
import { RolesGuide } from "../components/RolesGuide";

export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, the team's roster shows here.</EmptyState>;
  if (team.role !== "admin")
    return (
      <>
        <PageHeader eyebrow={team.name} title="Roster" />
        <EmptyState title="The roster is kept by team admins">
          Team admins invite members and set their roles. If you need someone added or your role changed, ask a team admin of {team.name}.
        </EmptyState>
      </>
    );
  return <AdminRoster teamId={team.id} teamName={team.name} />;
}

function AdminRoster({ teamId, teamName }: { teamId: string; teamName: string }) {
  const me = useSession();
  const roster = useRoster(teamId);

  return (
    <>
      <PageHeader eyebrow={teamName} title="Roster" description="Who is in the team, what each person can do, and who has been invited." />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="flex min-w-0 flex-col gap-6">
          {roster.isPending ? (
            <PageSpinner label="Loading the roster…" />
          ) : roster.isError ? (
            <LoadError title="Couldn't load the roster" error={roster.error} onRetry={() => roster.refetch()} />
          ) : (
            <>
              <MembersTable teamId={teamId} teamName={teamName} members={roster.data.members} myUserId={me.user.id} />
              <InvitationsTable teamId={teamId} invitations={roster.data.invitations} />
            </>
          )}
        </div>
        <aside className="flex flex-col gap-6">
          <InviteForm teamId={teamId} teamName={teamName} />
          <RolesGuide />
        </aside>
      </div>
    </>
  );
}
