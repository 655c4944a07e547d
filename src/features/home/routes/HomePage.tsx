import { Link, useLocation } from "react-router-dom";
import { Badge, EmptyState, PageHeader } from "@/components/ui";
import { visibleNav } from "@/app/nav";
import { roleLabel, roleMeaning } from "@/lib/roles";
import { useActiveTeam, useSession } from "@/lib/session";

export function Component() {
  const me = useSession();
  const team = useActiveTeam();
  const firstName = me.user.name.split(/\s+/)[0] || me.user.name;
  // Set by the invitation page right after someone joins.
  const joinedTeam = (useLocation().state as { joinedTeam?: string } | null)?.joinedTeam;

  if (!team) {
    return (
      <>
        <PageHeader title={`Welcome, ${firstName}`} />
        <EmptyState title="You're not in a team yet">
          Everything in Loadframe belongs to a team. When a team admin invites you, the link in the e-mail brings you straight in.
        </EmptyState>
      </>
    );
  }

  return (
    <>
      <PageHeader
        eyebrow={team.name}
        title={joinedTeam ? `Welcome to ${joinedTeam}, ${firstName}` : `Welcome back, ${firstName}`}
        description={
          <>
            You're working in {team.name} as <Badge tone="accent">{roleLabel[team.role]}</Badge> — {roleMeaning[team.role].replace(/^./, (c) => c.toLowerCase())}
          </>
        }
      />
      <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
        {visibleNav(team.role).map((item) => (
          <li key={item.to}>
            <Link
              to={item.to}
              className="group flex h-full flex-col rounded-[var(--radius-card)] border border-line bg-surface p-5 shadow-[var(--shadow-card)] transition-colors hover:border-accent/50 hover:bg-accent-soft/40"
            >
              <span className="flex items-center justify-between text-base font-semibold text-ink">
                {item.label}
                <span aria-hidden className="text-ink-faint transition-transform group-hover:translate-x-0.5 group-hover:text-accent">
                  →
                </span>
              </span>
              <span className="mt-1.5 text-sm text-ink-muted">{item.description}</span>
            </Link>
          </li>
        ))}
      </ul>
    </>
  );
}
