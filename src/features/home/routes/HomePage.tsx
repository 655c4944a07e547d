import { Link, useLocation } from "react-router-dom";
import { Badge, EmptyState, LoadError, PageHeader, Spinner } from "@/components/ui";
import { visibleNav } from "@/app/nav";
import { roleLabel, roleMeaning } from "@/lib/roles";
import { useActiveTeam, useSession } from "@/lib/session";
import { useHome } from "../api/home";
import { PlayerHome } from "../components/PlayerHome";
import { TaskList } from "../components/TaskList";

/** Home answers "what needs me now?" for the member's role, then lists the areas they can open. */
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

  const player = team.role === "player";
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
      <section aria-labelledby="home-now" className="mb-8">
        <h2 id="home-now" className="mb-3 text-lg font-semibold text-ink">
          {player ? "Your shots" : "Needs you now"}
        </h2>
        <HomeNow teamId={team.id} />
      </section>
      <h2 className="mb-3 text-lg font-semibold text-ink">{player ? "Where to look" : "Everything else"}</h2>
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
              <span className="mt-1.5 text-sm text-ink-muted">{(player && item.playerDescription) || item.description}</span>
            </Link>
          </li>
        ))}
      </ul>
    </>
  );
}

function HomeNow({ teamId }: { teamId: string }) {
  const home = useHome(teamId);
  if (home.isPending) return <Spinner label="Looking for what needs you" />;
  if (home.isError) return <LoadError title="Could not load what needs you" error={home.error} onRetry={() => void home.refetch()} />;
  return home.data.player ? <PlayerHome home={home.data.player} /> : <TaskList tasks={home.data.tasks} />;
}
